using LineTest.Core.Results;

namespace LineTest.Core.Statistics;

/// <summary>First-pass and final yield, retest and error rates, and failure Pareto from run outcomes.</summary>
public static class YieldAnalysis
{
    /// <summary>Pareto name for a failed run that does not name its failing reading.</summary>
    public const string UnnamedFailure = "(no reading named)";

    /// <summary>Pareto name for an error run without a reason.</summary>
    public const string UnspecifiedError = "(no reason given)";

    /// <summary>
    /// Summarizes runs in any order. A unit's runs are ordered by <see cref="RunOutcome.EndedUtc"/>; runs of
    /// one serial with equal end times keep their input order. Serials compare ordinally. O(N) time.
    /// </summary>
    public static YieldSummary Summarize(IReadOnlyList<RunOutcome> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);

        // Per serial: input index of the first and of the last run.
        var units = new Dictionary<string, (int First, int Last)>(StringComparer.Ordinal);
        var counts = new YieldCounts();
        for (var i = 0; i < runs.Count; i++)
        {
            var run = runs[i] ?? throw new ArgumentException($"runs[{i}] is null.", nameof(runs));
            if (string.IsNullOrWhiteSpace(run.Serial))
            {
                throw new ArgumentException($"runs[{i}] has no serial; every run belongs to a unit.", nameof(runs));
            }

            switch (run.Verdict)
            {
                case Verdict.Pass:
                    counts.AddRuns(Verdict.Pass, null);
                    break;
                case Verdict.Fail:
                    counts.AddRuns(Verdict.Fail, run.FailureName);
                    break;
                case Verdict.Error:
                    counts.AddRuns(Verdict.Error, run.ErrorReason);
                    break;
                default:
                    throw new ArgumentException($"runs[{i}] has an unknown verdict {(int)run.Verdict}.", nameof(runs));
            }

            if (units.TryGetValue(run.Serial, out var span))
            {
                var first = run.EndedUtc < runs[span.First].EndedUtc ? i : span.First;
                var last = run.EndedUtc >= runs[span.Last].EndedUtc ? i : span.Last;
                units[run.Serial] = (first, last);
            }
            else
            {
                units.Add(run.Serial, (i, i));
            }
        }

        int firstPassed = 0, lastPassed = 0;
        foreach (var (first, last) in units.Values)
        {
            if (runs[first].Verdict == Verdict.Pass)
            {
                firstPassed++;
            }

            if (runs[last].Verdict == Verdict.Pass)
            {
                lastPassed++;
            }
        }

        counts.AddUnits(units.Count, firstPassed, lastPassed);
        return Summarize(counts);
    }

    /// <summary>
    /// The summary of counts made elsewhere (e.g. by an SQL <c>GROUP BY</c> that applied the same first- and last-run
    /// rule): the same rates and Pareto bars <see cref="Summarize(IReadOnlyList{RunOutcome})"/> gives for the runs counted.
    /// </summary>
    public static YieldSummary Summarize(YieldCounts counts)
    {
        ArgumentNullException.ThrowIfNull(counts);
        var runs = counts.Runs;
        var unitCount = counts.Units;
        return new YieldSummary
        {
            Runs = runs,
            Units = unitCount,
            PassRuns = counts.PassRuns,
            FailRuns = counts.FailRuns,
            ErrorRuns = counts.ErrorRuns,
            UnitsPassedFirstRun = counts.UnitsPassedFirstRun,
            UnitsPassedLastRun = counts.UnitsPassedLastRun,
            FirstPassYield = unitCount == 0 ? null : (double)counts.UnitsPassedFirstRun / unitCount,
            FinalYield = unitCount == 0 ? null : (double)counts.UnitsPassedLastRun / unitCount,
            RetestRate = unitCount == 0 ? null : (double)(runs - unitCount) / unitCount,
            ErrorRate = runs == 0 ? null : (double)counts.ErrorRuns / runs,
            FailurePareto = Pareto(counts.Failures),
            ErrorReasons = Pareto(counts.Errors),
        };
    }

    /// <summary>Pareto bars from counts: descending count, ties by name (ordinal).</summary>
    public static IReadOnlyList<ParetoEntry> Pareto(IReadOnlyDictionary<string, int> counts)
    {
        ArgumentNullException.ThrowIfNull(counts);
        var ordered = new List<KeyValuePair<string, int>>(counts);
        ordered.Sort((a, b) => a.Value != b.Value ? b.Value.CompareTo(a.Value) : string.CompareOrdinal(a.Key, b.Key));
        long total = 0;
        foreach (var entry in ordered)
        {
            if (entry.Value < 0)
            {
                throw new ArgumentException($"The count for '{entry.Key}' is negative ({entry.Value}).", nameof(counts));
            }

            total += entry.Value;
        }

        var result = new List<ParetoEntry>(ordered.Count);
        long running = 0;
        foreach (var entry in ordered)
        {
            running += entry.Value;
            result.Add(new ParetoEntry(
                entry.Key,
                entry.Value,
                total == 0 ? 0 : (double)entry.Value / total,
                total == 0 ? 0 : (double)running / total));
        }

        return result;
    }
}
