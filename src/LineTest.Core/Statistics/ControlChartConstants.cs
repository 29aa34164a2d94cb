namespace LineTest.Core.Statistics;

/// <summary>
/// Shewhart control-chart constants for subgroup size n = 2…5 (ASTM E2587 and the usual handbook tables;
/// the values agree across them). A2 for X̄ limits from R̄, D3 and D4 for R-chart limits, d2 the mean of
/// the relative range (σ̂ = R̄/d2).
/// </summary>
/// <param name="SubgroupSize">n.</param>
/// <param name="A2">X̄ chart: limits X̿ ± A2·R̄.</param>
/// <param name="D3">R chart lower limit factor.</param>
/// <param name="D4">R chart upper limit factor.</param>
/// <param name="SmallD2">d2 (lower-case in the tables): expected range of n standard normal values.</param>
public readonly record struct ControlChartConstants(int SubgroupSize, double A2, double D3, double D4, double SmallD2)
{
    /// <summary>The table for n = 2, 3, 4, 5.</summary>
    public static IReadOnlyList<ControlChartConstants> Table { get; } =
    [
        new(2, 1.880, 0, 3.267, 1.128),
        new(3, 1.023, 0, 2.574, 1.693),
        new(4, 0.729, 0, 2.282, 2.059),
        new(5, 0.577, 0, 2.114, 2.326),
    ];

    /// <summary>The constants for subgroup size n (2…5).</summary>
    public static ControlChartConstants For(int subgroupSize)
    {
        if (subgroupSize < 2 || subgroupSize > 5)
        {
            throw new ArgumentOutOfRangeException(nameof(subgroupSize), subgroupSize, "Control-chart constants are tabled here for subgroup sizes 2 to 5.");
        }

        return Table[subgroupSize - 2];
    }
}
