using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class NormalDistributionTests
{
    [Fact]
    public void Cdf_GridFromMinus8To8_MatchesMathNet()
    {
        for (var z = -8.0; z <= 8.0; z += 0.125)
        {
            // MathNet.Numerics Normal.CDF as independent reference; relative check in the lower tail.
            var expected = Normal.CDF(0, 1, z);
            var actual = NormalDistribution.Cdf(z);
            Assert.True(Math.Abs(expected - actual) <= 1e-15 + (1e-12 * expected), $"Φ({z}) = {actual}, MathNet {expected}");
        }
    }

    [Fact]
    public void SmallerTail_DenseGridAcrossEveryRangeBreak_MatchesMathNetToRelative1e14AndTheReferenceRounding()
    {
        // MathNet.Numerics SpecialFunctions.Erfc as independent reference: Φ(−|z|) = ½·erfc(|z|/√2). The grid steps by
        // 1/1024 from 0 to 40 and adds points either side of the approximation's breaks (0.66291 and √32).
        var points = new List<double>();
        for (var i = 0; i <= 40 * 1024; i++)
        {
            points.Add(i / 1024.0);
        }

        foreach (var b in new[] { 0.66291, Math.Sqrt(32) })
        {
            points.Add(Math.BitDecrement(b));
            points.Add(b);
            points.Add(Math.BitIncrement(b));
        }

        var worst = 0.0;
        foreach (var y in points)
        {
            var expected = 0.5 * MathNet.Numerics.SpecialFunctions.Erfc(y / Math.Sqrt(2));
            if (expected < 1e-300)
            {
                // Subnormal or zero: only a few bits are left, so only the size is compared.
                Assert.True(NormalDistribution.SmallerTail(y) < 1e-300, $"Φ(−{y}) = {NormalDistribution.SmallerTail(y)}");
                continue;
            }

            foreach (var z in new[] { y, -y })
            {
                // The reference's own argument y/√2 is rounded (relative 1.1e-16), which moves erfc by about y² times
                // that in relative terms: the tolerance grows with y² accordingly.
                var relative = Math.Abs(NormalDistribution.SmallerTail(z) - expected) / expected;
                worst = Math.Max(worst, relative);
                Assert.True(relative <= 1e-14 + (4e-16 * y * y), $"Φ(−|{z}|) = {NormalDistribution.SmallerTail(z):R}, MathNet {expected:R}, relative {relative:E2}");
            }
        }

        Assert.True(worst > 0, "the grid compared nothing");
    }

    [Fact]
    public void SmallerTail_PublishedTailAreas_Match()
    {
        // Tail areas of the standard normal [from memory: Φ(−1) = 0.158655253931457, Φ(−2) = 0.0227501319481792,
        // Φ(−3) = 0.00134989803163010, Φ(−6) = 9.86587645037698e-10, Q(10) = 7.61985302416047e-24].
        Assert.Equal(1, NormalDistribution.SmallerTail(1) / 0.158655253931457, 1e-13);
        Assert.Equal(1, NormalDistribution.SmallerTail(-2) / 0.0227501319481792, 1e-13);
        Assert.Equal(1, NormalDistribution.SmallerTail(3) / 0.00134989803163010, 1e-13);
        Assert.Equal(1, NormalDistribution.SmallerTail(-6) / 9.86587645037698e-10, 1e-13);
        Assert.Equal(1, NormalDistribution.SmallerTail(10) / 7.61985302416047e-24, 1e-13);
        Assert.Equal(0.5, NormalDistribution.SmallerTail(0));
        Assert.Equal(0, NormalDistribution.SmallerTail(double.NegativeInfinity));
        Assert.Throws<ArgumentOutOfRangeException>(() => NormalDistribution.SmallerTail(double.NaN));
    }

    [Fact]
    public void Cdf_KnownPoints_MatchTables()
    {
        // Standard normal table values [published, any statistics handbook].
        Assert.Equal(0.5, NormalDistribution.Cdf(0), 1e-15);
        Assert.Equal(0.841344746, NormalDistribution.Cdf(1), 1e-9);
        Assert.Equal(0.977249868, NormalDistribution.Cdf(2), 1e-9);
        Assert.Equal(0.998650102, NormalDistribution.Cdf(3), 1e-9);
    }

    [Fact]
    public void UpperTail_FarTail_KeepsRelativePrecision()
    {
        // Q(10) = 7.6198530241605e-24 [derived from erfc(10/√2)/2].
        Assert.Equal(1.0, NormalDistribution.UpperTail(10) / 7.6198530241605e-24, 1e-10);
    }

    [Fact]
    public void Quantile_Grid_MatchesMathNet()
    {
        double[] ps = [1e-12, 1e-8, 1e-4, 0.001, 0.01, 0.02425, 0.025, 0.05, 0.1, 0.3, 0.5, 0.7, 0.9, 0.95, 0.975, 0.99, 0.999, 0.9999, 1 - 1e-8];
        foreach (var p in ps)
        {
            // MathNet.Numerics Normal.InvCDF as independent reference.
            var expected = Normal.InvCDF(0, 1, p);
            Assert.True(Math.Abs(expected - NormalDistribution.Quantile(p)) <= 1e-9 * Math.Max(1, Math.Abs(expected)), $"z({p})");
        }
    }

    [Fact]
    public void Quantile_975_Is1Point95996()
    {
        // z(0.975) = 1.959964 [published, normal tables].
        Assert.Equal(1.959964, NormalDistribution.Quantile(0.975), 1e-6);
    }

    [Fact]
    public void Quantile_InverseOfCdf_Property()
    {
        // Above z ≈ 5, p = Φ(z) is so close to 1 that the double itself no longer pins z down; the lower
        // tail keeps full relative precision, so the range is asymmetric on purpose.
        Gen.Double[-30, 5].Sample(z => Math.Abs(NormalDistribution.Quantile(NormalDistribution.Cdf(z)) - z) < 1e-8 * Math.Max(1, Math.Abs(z)));
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(1.0)]
    [InlineData(-0.1)]
    [InlineData(double.NaN)]
    public void Quantile_ProbabilityOutsideOpenInterval_Throws(double p)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => NormalDistribution.Quantile(p));
    }
}
