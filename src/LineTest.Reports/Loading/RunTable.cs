using System.Globalization;
using LineTest.Core.Results;
using LineTest.Core.Statistics;

namespace LineTest.Reports.Loading;

/// <summary>
/// The runs of a report, one column per field (primitive lists and interned strings), so a million runs cost
/// tens of megabytes rather than a million objects. Runs are numbered in the order they were added.
/// </summary>
public sealed partial class RunTable
{
    private readonly List<string?> _serials = [];
    private readonly List<long> _endedTicks = [];
    private readonly List<Verdict> _verdicts = [];
    private readonly List<int> _slots = [];
    private readonly List<int> _stations = [];
    private readonly List<int> _lots = [];
    private readonly List<int> _sequences = [];
    private readonly List<int> _revisions = [];
    private readonly List<int> _failures = [];
    private readonly List<int> _reasons = [];
    private readonly List<int> _operators = [];
    private readonly StringPool _pool = new();
    private readonly Dictionary<string, int> _unitIds = new(StringComparer.Ordinal);
    private readonly List<int> _unitOfRun = [];
    private UnitNumbers? _units;

    /// <summary>Number of runs.</summary>
    public int Count => _serials.Count;

    /// <summary>
    /// False when runs were added without their outcome (<see cref="AddWithoutOutcome"/>): yield then comes from the
    /// source's <see cref="YieldTally"/>, and serials, verdicts and outcomes cannot be asked for.
    /// </summary>
    public bool HasOutcomes { get; private set; } = true;

    /// <summary>False when the source gave no run times (a CSV without a time column).</summary>
    public bool HasTimes { get; internal set; } = true;

    /// <summary>Adds a run and returns its index.</summary>
    /// <param name="serial">The unit's serial.</param>
    /// <param name="endedUtc">When the run ended (orders a unit's runs).</param>
    /// <param name="verdict">The run's verdict.</param>
    /// <param name="station">Station id.</param>
    /// <param name="slot">Slot number.</param>
    /// <param name="lot">Lot, if known.</param>
    /// <param name="sequenceId">Sequence id, if known.</param>
    /// <param name="revision">Sequence revision, if known.</param>
    /// <param name="failureName">First failing reading of a failed run.</param>
    /// <param name="reason">Reason of a failed or error run.</param>
    public int Add(
        string serial,
        DateTimeOffset endedUtc,
        Verdict verdict,
        string station,
        int slot,
        string? lot,
        string? sequenceId,
        int? revision,
        string? failureName,
        string? reason)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(serial);
        if (!HasOutcomes)
        {
            throw new InvalidOperationException("This table holds runs without outcomes; a run with its outcome cannot join them.");
        }

        return Append(serial, endedUtc, verdict, station, slot, lot, sequenceId, revision, failureName, reason);
    }

    /// <summary>
    /// Adds a run without its unit and outcome, for a source that counts yield itself (<see cref="YieldTally"/>): the
    /// report needs only what places the run's readings (time, station, slot, lot, sequence). Returns its index.
    /// </summary>
    public int AddWithoutOutcome(DateTimeOffset endedUtc, string station, int slot, string? lot, string? sequenceId, int? revision)
    {
        if (HasOutcomes && Count > 0)
        {
            throw new InvalidOperationException("This table holds runs with outcomes; a run without one cannot join them.");
        }

        HasOutcomes = false;
        return Append(null, endedUtc, Core.Results.Verdict.Pass, station, slot, lot, sequenceId, revision, null, null);
    }

    /// <summary>
    /// The table's number for <paramref name="text"/> (−1 for null), for <see cref="AddNumbered"/>: a source that holds
    /// its texts numbered already asks once per distinct text instead of once per run.
    /// </summary>
    public int TextNumber(string? text) => _pool.Intern(text);

    /// <summary>
    /// Adds a run whose texts are given as this table's numbers (<see cref="TextNumber"/>; −1 for none) and whose
    /// revision is <see cref="int.MinValue"/> for none; the same run as <see cref="Add"/> with those texts. Returns its index.
    /// </summary>
    public int AddNumbered(string serial, long endedTicks, Verdict verdict, int station, int slot, int lot, int sequence, int revision, int failure, int reason)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(serial);
        if (!HasOutcomes)
        {
            throw new InvalidOperationException("This table holds runs without outcomes; a run with its outcome cannot join them.");
        }

        if (_pool.Text(station) is null)
        {
            throw new ArgumentOutOfRangeException(nameof(station), station, "A run needs a station.");
        }

        return AppendNumbered(serial, endedTicks, verdict, station, slot, lot, sequence, revision, failure, reason);
    }

    /// <summary>
    /// Makes room for <paramref name="count"/> runs in all, so a source that knows how many is coming sizes the table
    /// (and its table of units by serial) once instead of growing it step by step.
    /// </summary>
    public void EnsureCapacity(int count)
    {
        // The units' table is grown at least twofold, as adding would grow it: a source that asks for a little more
        // room at a time does not have it rebuilt at every step.
        if (count > _unitIds.Capacity)
        {
            _unitIds.EnsureCapacity(Math.Max(count, 2 * _unitIds.Capacity));
        }

        _serials.EnsureCapacity(count);
        _endedTicks.EnsureCapacity(count);
        _verdicts.EnsureCapacity(count);
        _slots.EnsureCapacity(count);
        _stations.EnsureCapacity(count);
        _lots.EnsureCapacity(count);
        _sequences.EnsureCapacity(count);
        _revisions.EnsureCapacity(count);
        _failures.EnsureCapacity(count);
        _reasons.EnsureCapacity(count);
        _operators.EnsureCapacity(count);
        _unitOfRun.EnsureCapacity(count);
    }

    private int Append(
        string? serial,
        DateTimeOffset endedUtc,
        Verdict verdict,
        string station,
        int slot,
        string? lot,
        string? sequenceId,
        int? revision,
        string? failureName,
        string? reason)
    {
        ArgumentNullException.ThrowIfNull(station);
        return AppendNumbered(
            serial,
            endedUtc.UtcTicks,
            verdict,
            _pool.Intern(station),
            slot,
            _pool.Intern(lot),
            _pool.Intern(sequenceId),
            revision ?? int.MinValue,
            _pool.Intern(failureName),
            _pool.Intern(reason));
    }

    private int AppendNumbered(string? serial, long endedTicks, Verdict verdict, int station, int slot, int lot, int sequence, int revision, int failure, int reason)
    {
        _serials.Add(serial);
        if (serial is not null)
        {
            NumberUnit(serial);
        }

        _endedTicks.Add(endedTicks);
        _verdicts.Add(verdict);
        _slots.Add(slot);
        _stations.Add(station);
        _lots.Add(lot);
        _sequences.Add(sequence);
        _revisions.Add(revision);
        _failures.Add(failure);
        _reasons.Add(reason);
        _operators.Add(-1);
        return _serials.Count - 1;
    }

    /// <summary>Sets the operator of run <paramref name="run"/> (read only when a report groups by operator).</summary>
    public void SetOperator(int run, string? name) => _operators[run] = _pool.Intern(string.IsNullOrWhiteSpace(name) ? null : name);

    /// <summary>Operator of run <paramref name="run"/>, or null.</summary>
    public string? Operator(int run) => _pool.Text(_operators[run]);

    /// <summary>Sequence id of run <paramref name="run"/>, or null when the source gave none.</summary>
    public string? SequenceId(int run) => _pool.Text(_sequences[run]);

    /// <summary>A small number standing for the run's sequence id (equal ids, equal numbers; -1 for none).</summary>
    internal int SequenceKey(int run) => _sequences[run];

    /// <summary>Sequence revision of run <paramref name="run"/>, or null.</summary>
    public int? Revision(int run) => _revisions[run] == int.MinValue ? null : _revisions[run];

    /// <summary>Serial of run <paramref name="run"/>.</summary>
    public string Serial(int run) => _serials[run] ?? throw NoOutcomes();

    /// <summary>End of run <paramref name="run"/> (UTC).</summary>
    public DateTimeOffset EndedUtc(int run) => new(_endedTicks[run], TimeSpan.Zero);

    /// <summary>Verdict of run <paramref name="run"/>.</summary>
    public Verdict Verdict(int run)
    {
        RequireOutcomes();
        return _verdicts[run];
    }

    /// <summary>Slot of run <paramref name="run"/>.</summary>
    public int Slot(int run) => _slots[run];

    /// <summary>Station of run <paramref name="run"/>.</summary>
    public string Station(int run) => _pool.Text(_stations[run])!;

    /// <summary>Lot of run <paramref name="run"/>, or null.</summary>
    public string? Lot(int run) => _pool.Text(_lots[run]);

    /// <summary>The run's outcome as yield statistics need it.</summary>
    public RunOutcome Outcome(int run)
    {
        RequireOutcomes();
        var verdict = _verdicts[run];
        var reason = _pool.Text(_reasons[run]);
        return new RunOutcome(
            _serials[run]!,
            EndedUtc(run),
            verdict,
            verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[run]) : null,
            verdict == Core.Results.Verdict.Error ? reason : null);
    }

    /// <summary>The runs with the given indices as outcomes, built on demand (no copy of the table).</summary>
    public IReadOnlyList<RunOutcome> Outcomes(IReadOnlyList<int>? runs = null) => new OutcomeView(this, runs);

    /// <summary>The group that run <paramref name="run"/> falls in under <paramref name="grouping"/>.</summary>
    public string GroupKey(int run, ReportGrouping grouping, NamedShifts? shifts = null) => GroupKeyOf(
        grouping,
        Station(run),
        _slots[run],
        Lot(run),
        HasTimes ? EndedUtc(run) : null,
        SequenceId(run),
        Revision(run),
        grouping == ReportGrouping.Operator ? Operator(run) : null,
        shifts);

    /// <summary>
    /// The group of a run with these fields under <paramref name="grouping"/> (<paramref name="endedUtc"/> null: the
    /// source has no times). A source that groups runs itself names its groups with this, so the keys are the same.
    /// </summary>
    public static string GroupKeyOf(
        ReportGrouping grouping,
        string station,
        int slot,
        string? lot,
        DateTimeOffset? endedUtc,
        string? sequenceId,
        int? revision,
        string? operatorName,
        NamedShifts? shifts = null) => grouping switch
    {
        ReportGrouping.Operator => string.IsNullOrWhiteSpace(operatorName) ? "(no operator)" : operatorName,
        ReportGrouping.Shift => endedUtc is { } shiftTime ? (shifts ?? NamedShifts.Default).ShiftOf(shiftTime) : "(no time)",
        ReportGrouping.None => "all",
        ReportGrouping.Station => station,
        ReportGrouping.Slot => slot.ToString(CultureInfo.InvariantCulture),
        ReportGrouping.Lot => lot ?? "(no lot)",
        ReportGrouping.Day => endedUtc is { } day ? day.UtcDateTime.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) : "(no time)",
        ReportGrouping.Revision => RevisionKey(sequenceId, revision),
        _ => throw new ArgumentOutOfRangeException(nameof(grouping), grouping, "Unknown grouping."),
    };

    /// <summary>Orders group keys: slots numerically, everything else ordinally (days sort by date that way).</summary>
    public static int CompareGroupKeys(ReportGrouping grouping, string a, string b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        if (grouping == ReportGrouping.Slot
            && int.TryParse(a, NumberStyles.Integer, CultureInfo.InvariantCulture, out var x)
            && int.TryParse(b, NumberStyles.Integer, CultureInfo.InvariantCulture, out var y))
        {
            return x.CompareTo(y);
        }

        return string.CompareOrdinal(a, b);
    }

    private static string RevisionKey(string? sequenceId, int? revision)
    {
        var sequence = sequenceId ?? "(no sequence)";
        return revision is { } r ? string.Create(CultureInfo.InvariantCulture, $"{sequence} rev {r}") : sequence;
    }

    private void RequireOutcomes()
    {
        if (!HasOutcomes)
        {
            throw NoOutcomes();
        }
    }

    private static InvalidOperationException NoOutcomes() =>
        new("The runs were loaded without their outcomes; the source counted their yield (ReportData.Tally).");

    private sealed class OutcomeView(RunTable table, IReadOnlyList<int>? runs) : IReadOnlyList<RunOutcome>
    {
        public int Count => runs?.Count ?? table.Count;

        public RunOutcome this[int index] => table.Outcome(runs is null ? index : runs[index]);

        public IEnumerator<RunOutcome> GetEnumerator()
        {
            for (var i = 0; i < Count; i++)
            {
                yield return this[i];
            }
        }

        System.Collections.IEnumerator System.Collections.IEnumerable.GetEnumerator() => GetEnumerator();
    }
}
