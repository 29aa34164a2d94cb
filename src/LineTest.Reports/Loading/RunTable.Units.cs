using LineTest.Core.Results;
using LineTest.Core.Statistics;

namespace LineTest.Reports.Loading;

/// <summary>The run table's units: each run's unit numbered as it is added, first runs and yield counted from them.</summary>
public sealed partial class RunTable
{
    /// <summary>
    /// For each run, true when it is its unit's first run: the earliest end time of its serial, equal times in the
    /// order added (the rule <see cref="YieldAnalysis"/> uses for first-pass yield).
    /// </summary>
    public bool[] FirstRuns()
    {
        var flags = new bool[Count];
        foreach (var r in FirstAndLastRuns().FirstOf)
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
    /// The yield counts of each of <paramref name="groups"/> groups, where every run counts in the group of its unit
    /// (<paramref name="groupOfUnit"/>[unit], numbered as <see cref="Units"/> numbers them): a unit's first and last runs
    /// are then those of all its runs, by the rule of <see cref="CountYield"/>. The same counts as <see cref="CountYield"/>
    /// of each group's runs, without a table of units per group.
    /// </summary>
    public YieldCounts[] CountYieldByUnitGroup(int[] groupOfUnit, int groups)
    {
        ArgumentNullException.ThrowIfNull(groupOfUnit);
        var units = Units().Units;
        if (groupOfUnit.Length != units)
        {
            throw new ArgumentException($"groupOfUnit has {groupOfUnit.Length} entries for {units} units.", nameof(groupOfUnit));
        }

        return CountByUnitGroup(groupOfUnit, groups, FirstAndLastRuns());
    }

    /// <summary>
    /// As <see cref="CountYieldByUnitGroup"/>, each unit in the group of its first run (<paramref name="groupOfRun"/> of
    /// that run): every unit is in exactly one group, and the groups' runs and units add up to the whole table.
    /// </summary>
    public YieldCounts[] CountYieldByFirstRunGroup(int[] groupOfRun, int groups)
    {
        ArgumentNullException.ThrowIfNull(groupOfRun);
        if (groupOfRun.Length != Count)
        {
            throw new ArgumentException($"groupOfRun has {groupOfRun.Length} entries for {Count} runs.", nameof(groupOfRun));
        }

        var spans = FirstAndLastRuns();
        var groupOfUnit = new int[spans.FirstOf.Length];
        for (var u = 0; u < groupOfUnit.Length; u++)
        {
            groupOfUnit[u] = groupOfRun[spans.FirstOf[u]];
        }

        return CountByUnitGroup(groupOfUnit, groups, spans);
    }

    /// <summary>
    /// Each unit's first run (earliest end, equal ends: the first added) and last run (latest end, equal ends: the last
    /// added), in one pass over the runs; every numbered unit has at least one run.
    /// </summary>
    private (int[] FirstOf, int[] LastOf) FirstAndLastRuns()
    {
        var (unitOf, units) = Units();
        var firstOf = new int[units];
        var lastOf = new int[units];
        Array.Fill(firstOf, -1);
        for (var r = 0; r < Count; r++)
        {
            var unit = unitOf[r];
            if (firstOf[unit] < 0)
            {
                firstOf[unit] = r;
                lastOf[unit] = r;
                continue;
            }

            if (_endedTicks[r] < _endedTicks[firstOf[unit]])
            {
                firstOf[unit] = r;
            }

            if (_endedTicks[r] >= _endedTicks[lastOf[unit]])
            {
                lastOf[unit] = r;
            }
        }

        return (firstOf, lastOf);
    }

    private YieldCounts[] CountByUnitGroup(int[] groupOfUnit, int groups, (int[] FirstOf, int[] LastOf) spans)
    {
        var unitOf = Units().UnitOf;
        var counts = new YieldCounts[groups];
        for (var g = 0; g < groups; g++)
        {
            counts[g] = new YieldCounts();
        }

        for (var r = 0; r < Count; r++)
        {
            var verdict = _verdicts[r];
            counts[groupOfUnit[unitOf[r]]].AddRuns(
                verdict,
                verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[r]) : verdict == Core.Results.Verdict.Error ? _pool.Text(_reasons[r]) : null);
        }

        var seen = new int[groups];
        var firstPassed = new int[groups];
        var lastPassed = new int[groups];
        for (var u = 0; u < groupOfUnit.Length; u++)
        {
            var g = groupOfUnit[u];
            seen[g]++;
            firstPassed[g] += _verdicts[spans.FirstOf[u]] == Core.Results.Verdict.Pass ? 1 : 0;
            lastPassed[g] += _verdicts[spans.LastOf[u]] == Core.Results.Verdict.Pass ? 1 : 0;
        }

        for (var g = 0; g < groups; g++)
        {
            counts[g].AddUnits(seen[g], firstPassed[g], lastPassed[g]);
        }

        return counts;
    }

    /// <summary>
    /// The yield counts of the runs <paramref name="runs"/> (in increasing order; null: all), by the rule of
    /// <see cref="YieldAnalysis.Summarize(IReadOnlyList{RunOutcome})"/>: a unit's first run is its earliest end (equal ends:
    /// the first given), its last run its latest (equal ends: the last given). The same counts, without an outcome
    /// object or a serial lookup per run.
    /// </summary>
    public YieldCounts CountYield(IReadOnlyList<int>? runs = null)
    {
        if (runs is null)
        {
            return CountYieldByUnitGroup(new int[Units().Units], 1)[0];
        }

        var (unitOf, _) = Units();
        var spans = new Dictionary<int, (int First, int Last)>();
        var counts = new YieldCounts();
        for (var i = 0; i < runs.Count; i++)
        {
            var r = runs[i];
            var verdict = _verdicts[r];
            counts.AddRuns(
                verdict,
                verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[r]) : verdict == Core.Results.Verdict.Error ? _pool.Text(_reasons[r]) : null);
            var unit = unitOf[r];
            if (spans.TryGetValue(unit, out var span))
            {
                spans[unit] = (_endedTicks[r] < _endedTicks[span.First] ? r : span.First, _endedTicks[r] >= _endedTicks[span.Last] ? r : span.Last);
            }
            else
            {
                spans.Add(unit, (r, r));
            }
        }

        int seen = 0, firstPassed = 0, lastPassed = 0;
        foreach (var (f, l) in spans.Values)
        {
            seen++;
            firstPassed += _verdicts[f] == Core.Results.Verdict.Pass ? 1 : 0;
            lastPassed += _verdicts[l] == Core.Results.Verdict.Pass ? 1 : 0;
        }

        counts.AddUnits(seen, firstPassed, lastPassed);
        return counts;
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

    /// <summary>Each run's unit number and the number of units (one object, so a reader on another thread sees both or neither).</summary>
    private sealed record UnitNumbers(int[] UnitOf, int Units);
}
