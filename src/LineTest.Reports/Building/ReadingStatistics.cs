using LineTest.Core.Statistics;

namespace LineTest.Reports.Building;

/// <summary>Everything a report says about one reading name.</summary>
public sealed record ReadingStatistics
{
    /// <summary>Reading name.</summary>
    public required string Name { get; init; }

    /// <summary>Unit symbol.</summary>
    public required string Unit { get; init; }

    /// <summary>The sequence (one product) the values come from; null when the source names none.</summary>
    public string? SequenceId { get; init; }

    /// <summary>Which product, sequence and revisions the figures cover, e.g. "CTP-40A: ctp40a-dac rev 3".</summary>
    public string Covers { get; init; } = "all runs";

    /// <summary>
    /// True when the Anderson–Darling test rejects normality at 5 % (p &lt; 0.05): the normal-based indices and
    /// expected ppm are then not to be trusted, and <see cref="Percentile"/> is the figure to read.
    /// </summary>
    public bool NonNormal => Normality is { PValue: < NormalityAlpha };

    /// <summary>The significance level of the normality flag.</summary>
    public const double NormalityAlpha = 0.05;

    /// <summary>Percentile-based capability (ISO 22514-2 percentile method); null when <see cref="PercentileNote"/> says why not.</summary>
    public PercentileCapabilityResult? Percentile { get; init; }

    /// <summary>Why percentile capability was not computed.</summary>
    public string? PercentileNote { get; init; }

    /// <summary>Lower limit (of the latest reading with limits); null for none.</summary>
    public double? Low { get; init; }

    /// <summary>Upper limit (of the latest reading with limits); null for none.</summary>
    public double? High { get; init; }

    /// <summary>True when limits or unit changed within the data; the latest are used.</summary>
    public bool LimitsChanged { get; init; }

    /// <summary>Readings that had no numeric value (left out of every statistic).</summary>
    public required int Missing { get; init; }

    /// <summary>
    /// n, mean, both standard deviations and, when the reading has at least one limit, the capability indices,
    /// their bounds and the ppm figures (null where not defined).
    /// </summary>
    public required CapabilityResult Capability { get; init; }

    /// <summary>Anderson–Darling normality test; null when <see cref="NormalityNote"/> says why not.</summary>
    public AndersonDarlingResult? Normality { get; init; }

    /// <summary>Why the normality test was not computed.</summary>
    public string? NormalityNote { get; init; }

    /// <summary>Individuals chart limits and run-rule signals; null when <see cref="ChartNote"/> says why not.</summary>
    public IndividualsChartResult? Chart { get; init; }

    /// <summary>Why the control chart was not computed.</summary>
    public string? ChartNote { get; init; }

    /// <summary>The values in run order (for charts).</summary>
    public required ReadOnlyMemory<double> Values { get; init; }

    /// <summary>Number of numeric values.</summary>
    public int Count => Capability.Count;

    /// <summary>True when at least one limit is given.</summary>
    public bool HasLimits => Low.HasValue || High.HasValue;
}
