namespace LineTest.Core.Statistics;

/// <summary>
/// Yield of a set of runs. Rates are fractions (0…1), null when their denominator is zero (no runs).
/// An error run is never a pass: a unit whose first run ended in error did not pass first time.
/// </summary>
public sealed record YieldSummary
{
    /// <summary>Number of runs.</summary>
    public required int Runs { get; init; }

    /// <summary>Number of distinct serials.</summary>
    public required int Units { get; init; }

    /// <summary>Runs that passed.</summary>
    public required int PassRuns { get; init; }

    /// <summary>Runs that failed.</summary>
    public required int FailRuns { get; init; }

    /// <summary>Runs that ended in error.</summary>
    public required int ErrorRuns { get; init; }

    /// <summary>Units whose first run (earliest end time) passed.</summary>
    public required int UnitsPassedFirstRun { get; init; }

    /// <summary>Units whose last run (latest end time) passed.</summary>
    public required int UnitsPassedLastRun { get; init; }

    /// <summary>First-pass yield: units whose first run passed / units.</summary>
    public double? FirstPassYield { get; init; }

    /// <summary>Final yield: units whose last run passed / units.</summary>
    public double? FinalYield { get; init; }

    /// <summary>
    /// Retest rate: (runs − units)/units, the average number of extra runs per unit. 0 when every unit ran
    /// once; 0.5 when half the units ran twice. Can exceed 1.
    /// </summary>
    public double? RetestRate { get; init; }

    /// <summary>Error rate: error runs / runs.</summary>
    public double? ErrorRate { get; init; }

    /// <summary>Failed runs by the name of their first failing reading, most frequent first, ties by name (ordinal).</summary>
    public required IReadOnlyList<ParetoEntry> FailurePareto { get; init; }

    /// <summary>Error runs by reason, most frequent first, ties by reason (ordinal).</summary>
    public required IReadOnlyList<ParetoEntry> ErrorReasons { get; init; }
}
