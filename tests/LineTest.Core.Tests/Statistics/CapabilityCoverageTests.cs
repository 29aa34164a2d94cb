using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

/// <summary>
/// Whether the Cp and Cpk "95 %" bounds cover the true index 95 % of the time when σ within comes from moving ranges.
/// Fixed seed: the same draws every run.
/// </summary>
public sealed class CapabilityCoverageTests
{
    // 6,000 draws: with a true coverage of 95 % the observed share has a standard error of 0.28 %, so 94 % lies
    // 3.6 standard errors below it; a coverage of 88 % (the n − 1 bounds) would be 25 standard errors away.
    private const int Draws = 6000;

    [Theory]
    [InlineData(125)]
    [InlineData(30)]
    public void Analyze_NormalDataMonteCarlo_CpAndCpkBoundsCoverAtLeast94Percent(int n)
    {
        // True process: μ 0, σ 1, limits −3 … 4.5, so Cp = 7.5/6 = 1.25 and Cpk = min(4.5, 3)/3 = 1.00 [derived].
        var limits = SpecLimits.Between(-3, 4.5);
        const double trueCp = 1.25;
        const double trueCpk = 1.0;
        var random = new Random(20261203);
        var values = new double[n];
        int cpCovered = 0, cpkCovered = 0, ppCovered = 0;
        for (var d = 0; d < Draws; d++)
        {
            Normal.Samples(random, values, 0, 1);
            var r = Capability.Analyze(values, limits);
            cpCovered += Covers(r.CpInterval, trueCp);
            cpkCovered += Covers(r.CpkInterval, trueCpk);
            ppCovered += Covers(r.PpInterval, trueCp);
        }

        Assert.InRange(cpCovered / (double)Draws, 0.94, 0.965);
        Assert.InRange(cpkCovered / (double)Draws, 0.94, 0.97);
        Assert.InRange(ppCovered / (double)Draws, 0.94, 0.96);
    }

    [Fact]
    public void MovingRangeDegreesOfFreedom_MonteCarlo_MatchesTheVarianceOfMovingRangeSigma()
    {
        // The formula is derived; check it against simulation: Var(σ̂/σ) ≈ 1/(2ν) for σ̂ = MR̄/(2/√π).
        const int n = 50;
        var random = new Random(7);
        var values = new double[n];
        var estimates = new double[20000];
        for (var d = 0; d < estimates.Length; d++)
        {
            Normal.Samples(random, values, 0, 1);
            estimates[d] = Descriptive.AverageMovingRange(values) / (2 / Math.Sqrt(Math.PI));
        }

        var mean = estimates.Average();
        var variance = estimates.Sum(e => (e - mean) * (e - mean)) / (estimates.Length - 1);
        var nu = Capability.MovingRangeDegreesOfFreedom(n);
        Assert.Equal(1 / (2 * nu), variance, 0.1 * variance);
    }

    [Fact]
    public void MovingRangeDegreesOfFreedom_LargeN_IsAboutSixTenthsOfNMinusOne()
    {
        // Cryer & Ryan (1990, JQT 22): ν ≈ 0.62(n − 1) for MR̄/d2 [from memory]; the exact variance gives 0.605 [derived].
        var ratio = Capability.MovingRangeDegreesOfFreedom(10001) / 10000;
        Assert.Equal(0.605, ratio, 0.002);
        Assert.InRange(ratio, 0.62 - 0.03, 0.62 + 0.03);
    }

    [Fact]
    public void Analyze_WithinBounds_UseTheEffectiveDegreesOfFreedom()
    {
        var values = Enumerable.Range(0, 40).Select(i => Math.Sin(i * 1.7)).ToArray();
        var r = Capability.Analyze(values, SpecLimits.Between(-4, 4));
        var nu = r.WithinDegreesOfFreedom!.Value;
        Assert.Equal(Capability.MovingRangeDegreesOfFreedom(40), nu, 1e-12);

        // Chi-square bounds with ν (MathNet.Numerics as the independent quantile) [derived].
        var lower = r.Cp!.Value * Math.Sqrt(ChiSquared.InvCDF(nu, 0.025) / nu);
        var upper = r.Cp!.Value * Math.Sqrt(ChiSquared.InvCDF(nu, 0.975) / nu);
        Assert.Equal(lower, r.CpInterval!.Value.Lower, 1e-6);
        Assert.Equal(upper, r.CpInterval!.Value.Upper, 1e-6);
    }

    private static int Covers(ConfidenceInterval? interval, double truth) =>
        interval is { } ci && ci.Lower <= truth && truth <= ci.Upper ? 1 : 0;
}
