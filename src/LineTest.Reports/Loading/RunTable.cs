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
    private readonly List<string> _serials = [];
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

    /// <summary>Number of runs.</summary>
    public int Count => _serials.Count;

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
        ArgumentNullException.ThrowIfNull(station);
        _serials.Add(serial);
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
        var first = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var r = 0; r < Count; r++)
        {
            if (!first.TryGetValue(_serials[r], out var f) || _endedTicks[r] < _endedTicks[f])
            {
                first[_serials[r]] = r;
            }
        }

        var flags = new bool[Count];
        foreach (var r in first.Values)
        {
            flags[r] = true;
        }

        return flags;
    }

    /// <summary>Serial of run <paramref name="run"/>.</summary>
    public string Serial(int run) => _serials[run];

    /// <summary>End of run <paramref name="run"/> (UTC).</summary>
    public DateTimeOffset EndedUtc(int run) => new(_endedTicks[run], TimeSpan.Zero);

    /// <summary>Verdict of run <paramref name="run"/>.</summary>
    public Verdict Verdict(int run) => _verdicts[run];

    /// <summary>Slot of run <paramref name="run"/>.</summary>
    public int Slot(int run) => _slots[run];

    /// <summary>Station of run <paramref name="run"/>.</summary>
    public string Station(int run) => _pool.Text(_stations[run])!;

    /// <summary>Lot of run <paramref name="run"/>, or null.</summary>
    public string? Lot(int run) => _pool.Text(_lots[run]);

    /// <summary>The run's outcome as yield statistics need it.</summary>
    public RunOutcome Outcome(int run)
    {
        var verdict = _verdicts[run];
        var reason = _pool.Text(_reasons[run]);
        return new RunOutcome(
            _serials[run],
            EndedUtc(run),
            verdict,
            verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[run]) : null,
            verdict == Core.Results.Verdict.Error ? reason : null);
    }

    /// <summary>The runs with the given indices as outcomes, built on demand (no copy of the table).</summary>
    public IReadOnlyList<RunOutcome> Outcomes(IReadOnlyList<int>? runs = null) => new OutcomeView(this, runs);

    /// <summary>The group that run <paramref name="run"/> falls in under <paramref name="grouping"/>.</summary>
    public string GroupKey(int run, ReportGrouping grouping, NamedShifts? shifts = null) => grouping switch
    {
        ReportGrouping.Operator => Operator(run) ?? "(no operator)",
        ReportGrouping.Shift => HasTimes ? (shifts ?? NamedShifts.Default).ShiftOf(EndedUtc(run)) : "(no time)",
        ReportGrouping.None => "all",
        ReportGrouping.Station => Station(run),
        ReportGrouping.Slot => _slots[run].ToString(CultureInfo.InvariantCulture),
        ReportGrouping.Lot => Lot(run) ?? "(no lot)",
        ReportGrouping.Day => HasTimes ? EndedUtc(run).UtcDateTime.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) : "(no time)",
        ReportGrouping.Revision => RevisionKey(run),
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

    private string RevisionKey(int run)
    {
        var sequence = _pool.Text(_sequences[run]) ?? "(no sequence)";
        var revision = _revisions[run];
        return revision == int.MinValue ? sequence : string.Create(CultureInfo.InvariantCulture, $"{sequence} rev {revision}");
    }

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
