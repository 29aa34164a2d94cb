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
    /// The yield counts of each of <paramref name="groups"/> groups, in one pass over the runs, where every run counts in
    /// the group of its unit (<paramref name="groupOfUnit"/>[unit], numbered as <see cref="Units"/> numbers them): a
    /// unit's first and last runs are then those of all its runs, by the rule of <see cref="CountYield"/>. The same counts
    /// as <see cref="CountYield"/> of each group's runs, without a table of units per group.
    /// </summary>
    public YieldCounts[] CountYieldByUnitGroup(int[] groupOfUnit, int groups)
    {
        ArgumentNullException.ThrowIfNull(groupOfUnit);
        var (unitOf, units) = Units();
        if (groupOfUnit.Length != units)
        {
            throw new ArgumentException($"groupOfUnit has {groupOfUnit.Length} entries for {units} units.", nameof(groupOfUnit));
        }

        var counts = new YieldCounts[groups];
        for (var g = 0; g < groups; g++)
        {
            counts[g] = new YieldCounts();
        }

        var firstOf = new int[units];
        var lastOf = new int[units];
        Array.Fill(firstOf, -1);
        for (var r = 0; r < Count; r++)
        {
            var verdict = _verdicts[r];
            var unit = unitOf[r];
            counts[groupOfUnit[unit]].AddRuns(
                verdict,
                verdict == Core.Results.Verdict.Fail ? _pool.Text(_failures[r]) : verdict == Core.Results.Verdict.Error ? _pool.Text(_reasons[r]) : null);
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

        var seen = new int[groups];
        var firstPassed = new int[groups];
        var lastPassed = new int[groups];
        for (var u = 0; u < units; u++)
        {
            if (firstOf[u] >= 0)
            {
                var g = groupOfUnit[u];
                seen[g]++;
                firstPassed[g] += _verdicts[firstOf[u]] == Core.Results.Verdict.Pass ? 1 : 0;
                lastPassed[g] += _verdicts[lastOf[u]] == Core.Results.Verdict.Pass ? 1 : 0;
            }
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
