namespace LineTest.Core.Decisions;

/// <summary>
/// A combined standard uncertainty u_c and the expanded uncertainty U = k·u_c (JCGM 100:2008 §6.2.1).
/// </summary>
/// <param name="StandardUncertainty">Combined standard uncertainty u_c.</param>
/// <param name="CoverageFactor">Coverage factor k (2 for about 95 % with a normal distribution, §6.3.3).</param>
public sealed record ExpandedUncertainty(double StandardUncertainty, double CoverageFactor)
{
    /// <summary>U = k·u_c.</summary>
    public double Expanded => CoverageFactor * StandardUncertainty;

    /// <summary>Effective degrees of freedom, where known (Welch–Satterthwaite); null for infinite.</summary>
    public double? EffectiveDegreesOfFreedom { get; init; }
}
