using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class PercentileCapabilityTests
{
    [Theory]
    [InlineData(5, 0.00135)]
    [InlineData(5, 0.5)]
    [InlineData(100, 0.99865)]
    [InlineData(2000, 0.00135)]
    [InlineData(2000, 0.99865)]
    public void Quantile_MatchesMathNetDefinition7(int n, double p)
    {
        var values = new double[n];
        Gamma.Samples(new Random(n), values, 2, 1);
        var sorted = values.Order().ToArray();

        // Hyndman & Fan definition 7, computed independently by MathNet.Numerics (QuantileDefinition.R7) [derived].
        Assert.Equal(MathNet.Numerics.Statistics.Statistics.QuantileCustom(values, p, QuantileDefinition.R7), PercentileCapability.Quantile(sorted, p), 1e-12);
    }

    [Fact]
    public void Analyze_SkewedData_MatchesIndicesFromMathNetQuantiles()
    {
        var values = new double[3000];
        LogNormal.Samples(new Random(3), values, 0, 0.5);
        var limits = SpecLimits.Between(0.1, 6);
        var r = PercentileCapability.Analyze(values, limits).Value!;

        // ISO 22514-2 percentile method [from memory]: Pp = (U − L)/(X99.865 − X0.135),
        // Ppk = min((U − X50)/(X99.865 − X50), (X50 − L)/(X50 − X0.135)), quantiles from MathNet.Numerics [derived].
        var lo = MathNet.Numerics.Statistics.Statistics.QuantileCustom(values, 0.00135, QuantileDefinition.R7);
        var med = MathNet.Numerics.Statistics.Statistics.QuantileCustom(values, 0.5, QuantileDefinition.R7);
        var hi = MathNet.Numerics.Statistics.Statistics.QuantileCustom(values, 0.99865, QuantileDefinition.R7);
        Assert.Equal((6 - 0.1) / (hi - lo), r.Pp!.Value, 1e-12);
        Assert.Equal(Math.Min((6 - med) / (hi - med), (med - 0.1) / (med - lo)), r.Ppk!.Value, 1e-12);
        Assert.False(r.ExtremesInterpolated);
    }

    [Fact]
    public void Analyze_LargeNormalSample_AgreesWithNormalIndices()
    {
        // For normal data X0.135 and X99.865 are μ ∓ 3σ, so both methods estimate the same Pp [derived].
        var values = new double[200_000];
        Normal.Samples(new Random(5), values, 10, 2);
        var limits = SpecLimits.Between(2, 20);
        var percentile = PercentileCapability.Analyze(values, limits).Value!;
        var normal = Capability.Analyze(values, limits);
        Assert.Equal(normal.Pp!.Value, percentile.Pp!.Value, 0.02);
        Assert.Equal(normal.Ppk!.Value, percentile.Ppk!.Value, 0.02);
    }

    [Fact]
    public void Analyze_FewValues_SaysTheExtremesAreInterpolated()
    {
        var r = PercentileCapability.Analyze([1.0, 2, 3, 4, 5, 6], SpecLimits.Between(0, 10)).Value!;
        Assert.True(r.ExtremesInterpolated);
    }

    [Theory]
    [InlineData(new double[] { })]
    [InlineData(new double[] { 1 })]
    [InlineData(new double[] { 2, 2, 2, 2 })]
    public void Analyze_NotEnoughData_IsNotComputedWithAReason(double[] values)
    {
        var r = PercentileCapability.Analyze(values, SpecLimits.Between(0, 10));
        Assert.Null(r.Value);
        Assert.False(string.IsNullOrWhiteSpace(r.Reason));
    }

    [Fact]
    public void Analyze_NoLimits_IsNotComputed()
    {
        Assert.Null(PercentileCapability.Analyze([1.0, 2, 3, 4], new SpecLimits(null, null)).Value);
    }

    [Fact]
    public void AnalyzeSorted_SameAsAnalyze()
    {
        // The same order statistics whichever way the values arrive [derived].
        Gen.Select(Gen.Double[-100, 100].Array[0, 200], Gen.Double[-150, -1], Gen.Double[1, 150]).Sample(t =>
        {
            var (values, low, high) = t;
            var limits = SpecLimits.Between(low, high);
            var sorted = values.Order().ToArray();
            var a = PercentileCapability.Analyze(values, limits);
            var b = PercentileCapability.AnalyzeSorted(sorted, limits);
            return Equals(a.Value, b.Value) && a.Reason == b.Reason;
        });
    }

    [Fact]
    public void AnalyzeSorted_NotAscending_ThrowsNamingWhere()
    {
        var ex = Assert.Throws<ArgumentException>(() => PercentileCapability.AnalyzeSorted([1.0, 3, 2, 4], SpecLimits.Between(0, 5)));
        Assert.Contains("sorted[1]", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void AnalyzeSorted_NonFiniteValue_Throws()
    {
        Assert.Throws<ArgumentException>(() => PercentileCapability.AnalyzeSorted([1.0, 2, double.PositiveInfinity], SpecLimits.Between(0, 5)));
    }
}
