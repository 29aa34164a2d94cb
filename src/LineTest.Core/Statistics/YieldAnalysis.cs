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
        var failures = new Dictionary<string, int>(StringComparer.Ordinal);
        var errors = new Dictionary<string, int>(StringComparer.Ordinal);
        int pass = 0, fail = 0, error = 0;
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
                    pass++;
                    break;
                case Verdict.Fail:
                    fail++;
                    Increment(failures, string.IsNullOrWhiteSpace(run.FailureName) ? UnnamedFailure : run.FailureName.Trim());
                    break;
                case Verdict.Error:
                    error++;
                    Increment(errors, string.IsNullOrWhiteSpace(run.ErrorReason) ? UnspecifiedError : run.ErrorReason.Trim());
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

        var unitCount = units.Count;
        return new YieldSummary
        {
            Runs = runs.Count,
            Units = unitCount,
            PassRuns = pass,
            FailRuns = fail,
            ErrorRuns = error,
            UnitsPassedFirstRun = firstPassed,
            UnitsPassedLastRun = lastPassed,
            FirstPassYield = unitCount == 0 ? null : (double)firstPassed / unitCount,
            FinalYield = unitCount == 0 ? null : (double)lastPassed / unitCount,
            RetestRate = unitCount == 0 ? null : (double)(runs.Count - unitCount) / unitCount,
            ErrorRate = runs.Count == 0 ? null : (double)error / runs.Count,
            FailurePareto = Pareto(failures),
            ErrorReasons = Pareto(errors),
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

    private static void Increment(Dictionary<string, int> counts, string key)
    {
        counts[key] = counts.TryGetValue(key, out var c) ? c + 1 : 1;
    }
}
