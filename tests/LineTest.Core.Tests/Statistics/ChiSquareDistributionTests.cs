using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class ChiSquareDistributionTests
{
    [Fact]
    public void Quantile_GridOfDegreesAndProbabilities_MatchesMathNet()
    {
        double[] dfs = [1, 2, 3, 5, 9, 19, 49, 99, 499, 4999];
        double[] ps = [0.001, 0.005, 0.025, 0.05, 0.1, 0.5, 0.9, 0.95, 0.975, 0.995, 0.999];
        foreach (var df in dfs)
        {
            foreach (var p in ps)
            {
                // MathNet.Numerics ChiSquared.InvCDF as independent reference.
                var expected = ChiSquared.InvCDF(df, p);
                var actual = ChiSquareDistribution.Quantile(df, p);
                Assert.True(Math.Abs(expected - actual) <= 1e-8 * Math.Max(1, expected), $"χ²({p}, {df}) = {actual}, MathNet {expected}");
            }
        }
    }

    [Fact]
    public void Quantile_TableValues_Match()
    {
        // Chi-square table [published]: χ²(0.95, 1) = 3.841, χ²(0.025, 19) = 8.907, χ²(0.975, 19) = 32.852.
        Assert.Equal(3.841, ChiSquareDistribution.Quantile(1, 0.95), 1e-3);
        Assert.Equal(8.907, ChiSquareDistribution.Quantile(19, 0.025), 1e-3);
        Assert.Equal(32.852, ChiSquareDistribution.Quantile(19, 0.975), 1e-3);
    }

    [Fact]
    public void CdfAndUpperTail_Grid_MatchMathNet()
    {
        double[] dfs = [1, 4, 10, 30];
        double[] xs = [0.1, 1, 3, 8, 20, 50];
        foreach (var df in dfs)
        {
            foreach (var x in xs)
            {
                // MathNet.Numerics ChiSquared.CDF as independent reference.
                var expected = ChiSquared.CDF(df, x);
                Assert.Equal(expected, ChiSquareDistribution.Cdf(df, x), 1e-12);
                Assert.Equal(1 - expected, ChiSquareDistribution.UpperTail(df, x), 1e-12);
            }
        }
    }

    [Fact]
    public void Quantile_ZeroDegrees_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => ChiSquareDistribution.Quantile(0, 0.5));
    }

    [Fact]
    public void Quantile_Property_InvertsCdf()
    {
        Gen.Select(Gen.Double[0.5, 2000], Gen.Double[1e-6, 1 - 1e-6]).Sample(t =>
        {
            var (df, p) = t;
            var x = ChiSquareDistribution.Quantile(df, p);
            return Math.Abs(ChiSquareDistribution.Cdf(df, x) - p) <= 1e-10;
        });
    }
}
