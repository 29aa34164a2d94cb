namespace LineTest.Core.Statistics;

/// <summary>
/// Individuals (X) and moving-range (MR, span 2) chart limits with run-rule signals.
/// </summary>
public sealed record IndividualsChartResult
{
    /// <summary>Number of points.</summary>
    public required int Count { get; init; }

    /// <summary>Centre line x̄.</summary>
    public required double Centre { get; init; }

    /// <summary>Average moving range MR̄ (span 2).</summary>
    public required double AverageMovingRange { get; init; }

    /// <summary>σ̂ = MR̄/d2 with d2 = 1.128.</summary>
    public required double SigmaWithin { get; init; }

    /// <summary>x̄ + 2.66·MR̄.</summary>
    public required double UpperControlLimit { get; init; }

    /// <summary>x̄ − 2.66·MR̄.</summary>
    public required double LowerControlLimit { get; init; }

    /// <summary>Moving-range chart upper limit 3.267·MR̄ (its lower limit is 0, D3 = 0 for n = 2).</summary>
    public required double MovingRangeUpperLimit { get; init; }

    /// <summary>
    /// Indices i of the points whose moving range |x[i] − x[i−1]| lies above <see cref="MovingRangeUpperLimit"/>.
    /// </summary>
    public required IReadOnlyList<int> MovingRangesAboveLimit { get; init; }

    /// <summary>Run-rule signals on the individuals chart, zones one third of the distance to a limit.</summary>
    public required IReadOnlyList<RunRuleSignal> Signals { get; init; }
}
