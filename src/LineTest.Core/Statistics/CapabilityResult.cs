namespace LineTest.Core.Statistics;

/// <summary>
/// Capability of one measurement against its specification limits.
/// </summary>
/// <remarks>
/// Null means "not defined", never zero: an index that needs both limits (Cp, Pp) is null for a one-sided
/// specification; every index is null when n &lt; 2 or the relevant σ is zero; <see cref="Notes"/> says why.
/// Cp, Cpu, Cpl and Cpk use the within (short-term) σ = MR̄/d2 from the moving range of span 2 in run order;
/// Pp, Ppu, Ppl and Ppk use the overall sample σ (n − 1). Expected ppm uses the overall σ (the long-term
/// spread the customer receives). NIST/SEMATECH e-Handbook §6.1.6 gives the index definitions.
/// </remarks>
public sealed record CapabilityResult
{
    /// <summary>The specification limits used.</summary>
    public required SpecLimits Limits { get; init; }

    /// <summary>Confidence level of the intervals, e.g. 0.95.</summary>
    public required double ConfidenceLevel { get; init; }

    /// <summary>Number of values.</summary>
    public required int Count { get; init; }

    /// <summary>Mean; null when there are no values.</summary>
    public double? Mean { get; init; }

    /// <summary>Overall sample standard deviation (n − 1); null when n &lt; 2.</summary>
    public double? StdDevOverall { get; init; }

    /// <summary>Average moving range (span 2, run order); null when n &lt; 2.</summary>
    public double? AverageMovingRange { get; init; }

    /// <summary>Within standard deviation MR̄/1.128; null when n &lt; 2.</summary>
    public double? StdDevWithin { get; init; }

    /// <summary>(USL − LSL)/(6σ within); null unless two-sided.</summary>
    public double? Cp { get; init; }

    /// <summary>(USL − mean)/(3σ within); null without an upper limit.</summary>
    public double? Cpu { get; init; }

    /// <summary>(mean − LSL)/(3σ within); null without a lower limit.</summary>
    public double? Cpl { get; init; }

    /// <summary>min(Cpu, Cpl) over the limits that exist.</summary>
    public double? Cpk { get; init; }

    /// <summary>(USL − LSL)/(6σ overall); null unless two-sided.</summary>
    public double? Pp { get; init; }

    /// <summary>(USL − mean)/(3σ overall); null without an upper limit.</summary>
    public double? Ppu { get; init; }

    /// <summary>(mean − LSL)/(3σ overall); null without a lower limit.</summary>
    public double? Ppl { get; init; }

    /// <summary>min(Ppu, Ppl) over the limits that exist.</summary>
    public double? Ppk { get; init; }

    /// <summary>
    /// Effective degrees of freedom of σ within (MR̄/d2), used by the Cp and Cpk bounds; null when σ within is not used.
    /// See <see cref="Capability.MovingRangeDegreesOfFreedom"/>.
    /// </summary>
    public double? WithinDegreesOfFreedom { get; init; }

    /// <summary>Chi-square interval on Cp with the effective degrees of freedom of σ within (about 0.6(n − 1)).</summary>
    public ConfidenceInterval? CpInterval { get; init; }

    /// <summary>Bissell (1990) normal-approximation interval on Cpk, with the effective degrees of freedom of σ within.</summary>
    public ConfidenceInterval? CpkInterval { get; init; }

    /// <summary>Chi-square interval on Pp (exact under normality).</summary>
    public ConfidenceInterval? PpInterval { get; init; }

    /// <summary>Bissell (1990) normal-approximation interval on Ppk.</summary>
    public ConfidenceInterval? PpkInterval { get; init; }

    /// <summary>Observed parts per million below the lower limit; null when n = 0 or there is no lower limit.</summary>
    public double? ObservedPpmBelow { get; init; }

    /// <summary>Observed parts per million above the upper limit; null when n = 0 or there is no upper limit.</summary>
    public double? ObservedPpmAbove { get; init; }

    /// <summary>Observed parts per million out of specification (both sides); null when n = 0 or there are no limits.</summary>
    public double? ObservedPpmTotal { get; init; }

    /// <summary>Expected ppm below the lower limit from a normal with the mean and overall σ.</summary>
    public double? ExpectedPpmBelow { get; init; }

    /// <summary>Expected ppm above the upper limit from a normal with the mean and overall σ.</summary>
    public double? ExpectedPpmAbove { get; init; }

    /// <summary>Expected ppm out of specification, both sides, from the overall σ.</summary>
    public double? ExpectedPpmTotal { get; init; }

    /// <summary>Why any value above is null; empty when all applicable values were computed.</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
}
