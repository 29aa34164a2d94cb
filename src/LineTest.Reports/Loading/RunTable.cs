using System.Globalization;
using LineTest.Core.Results;
using LineTest.Core.Statistics;
namespace LineTest.Reports.Loading;

/// <summary>
/// The runs of a report, one column per field (primitive lists and interned strings), so a million runs cost
/// tens of megabytes rather than a million objects. Runs are numbered in the order they were added.
/// </summary>
public sealed class RunTable
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

        _serials.Add(serial);
        NumberUnit(serial);
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

    private void NumberUnit(string serial)
    {
        if (!_unitIds.TryGetValue(serial, out var id))
        {
            id = _unitIds.Count;
            _unitIds.Add(serial, id);
        }

        _unitOfRun.Add(id);
    }

    /// <summary>Makes room for <paramref name="count"/> runs in all, so a source that knows how many is coming sizes the table once.</summary>
    public void EnsureCapacity(int count)
    {
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
        _serials.Add(serial);
        if (serial is not null)
        {
            NumberUnit(serial);
        }

        _endedTicks.Add(endedUtc.UtcTicks);
        _verdicts.Add(verdict);
        _slots.Add(slot);
        _stations.Add(_pool.Intern(station));
        _lots.Add(_pool.Intern(lot));
        _sequences.Add(_pool.Intern(sequenceId));
        _revisions.Add(revision ?? int.MinValue);
        _failures.Add(_pool.Intern(failureName));
        _reasons.Add(_pool.Intern(reason));
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

    /// <summary>
    /// For each run, true when it is its unit's first run: the earliest end time of its serial, equal times in the
    /// order added (the rule <see cref="YieldAnalysis"/> uses for first-pass yield).
    /// </summary>
    public bool[] FirstRuns()
    {
        var (unitOf, units) = Units();
        var first = new int[units];
        Array.Fill(first, -1);
        for (var r = 0; r < Count; r++)
        {
            var f = first[unitOf[r]];
            if (f < 0 || _endedTicks[r] < _endedTicks[f])
            {
                first[unitOf[r]] = r;
            }
        }

        var flags = new bool[Count];
        foreach (var r in first)
        {
            flags[r] = true;
        }

        return flags;
    }

    /// <summary>
    /// Each run's unit as a number (0, 1, … in the order serials first appear) and the number of units: serials compared
    /// once, so yield over a million runs is counted with arrays instead of a dictionary of serials per count. Made on
    /// first use after the last run was added (each run's unit is numbered as it is added, so a report does not wait for a
    /// pass over a million serials); safe to ask from several threads once made.
    /// </summary>
    public (int[] UnitOf, int Units) Units()
    {
        RequireOutcomes();
        if (_units is { } made && made.UnitOf.Length == Count)
        {
            return (made.UnitOf, made.Units);
        }

        var unitOf = _unitOfRun.ToArray();
        _units = new UnitNumbers(unitOf, _unitIds.Count);
        return (unitOf, _unitIds.Count);
    }

    /// <summary>
    /// The yield counts of the runs <paramref name="runs"/> (in increasing order; null: all), by the rule of
    /// <see cref="YieldAnalysis.Summarize(IReadOnlyList{RunOutcome})"/>: a unit's first run is its earliest end (equal ends:
    /// the first given), its last run its latest (equal ends: the last given). The same counts, without an outcome
    /// object or a serial lookup per run.
    /// </summary>
    public YieldCounts CountYield(IReadOnlyList<int>? runs = null)
    {
        var (unitOf, units) = Units();
        var first = new Dictionary<int, (int First, int Last)>();
        var counts = new YieldCounts();
        var all = runs is null;
        var count = all ? Count : runs!.Count;
        var firstOf = all ? new int[units] : null;
        var lastOf = all ? new int[units] : null;
        if (all)
        {
            Array.Fill(firstOf!, -1);
        }

        for (var i = 0; i < count; i++)
        {
            var r = all ? i : runs![i];
            var verdict = _verdicts[r];
            counts.AddRuns(
                verdict,
                verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[r]) : verdict == Core.Results.Verdict.Error ? _pool.Text(_reasons[r]) : null);
            var unit = unitOf[r];
            if (all)
            {
                if (firstOf![unit] < 0)
                {
                    firstOf[unit] = r;
                    lastOf![unit] = r;
                    continue;
                }

                if (_endedTicks[r] < _endedTicks[firstOf[unit]])
                {
                    firstOf[unit] = r;
                }

                if (_endedTicks[r] >= _endedTicks[lastOf![unit]])
                {
                    lastOf[unit] = r;
                }
            }
            else if (first.TryGetValue(unit, out var span))
            {
                first[unit] = (_endedTicks[r] < _endedTicks[span.First] ? r : span.First, _endedTicks[r] >= _endedTicks[span.Last] ? r : span.Last);
            }
            else
            {
                first.Add(unit, (r, r));
            }
        }

        int seen = 0, firstPassed = 0, lastPassed = 0;
        void Unit(int f, int l)
        {
            seen++;
            firstPassed += _verdicts[f] == Core.Results.Verdict.Pass ? 1 : 0;
            lastPassed += _verdicts[l] == Core.Results.Verdict.Pass ? 1 : 0;
        }

        if (all)
        {
            for (var u = 0; u < units; u++)
            {
                if (firstOf![u] >= 0)
                {
                    Unit(firstOf[u], lastOf![u]);
                }
            }
        }
        else
        {
            foreach (var (f, l) in first.Values)
            {
                Unit(f, l);
            }
        }

        counts.AddUnits(seen, firstPassed, lastPassed);
        return counts;
    }

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

    /// <summary>Each run's unit number and the number of units (one object, so a reader on another thread sees both or neither).</summary>
    private sealed record UnitNumbers(int[] UnitOf, int Units);
}
