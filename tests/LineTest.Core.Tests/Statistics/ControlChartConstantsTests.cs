using LineTest.Core.Statistics;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class ControlChartConstantsTests
{
    public static TheoryData<int, double, double, double, double> PublishedTable => new()
    {
        // Shewhart constants, ASTM E2587 and SPC handbooks [published]: n, A2, D3, D4, d2.
        { 2, 1.880, 0, 3.267, 1.128 },
        { 3, 1.023, 0, 2.574, 1.693 },
        { 4, 0.729, 0, 2.282, 2.059 },
        { 5, 0.577, 0, 2.114, 2.326 },
    };

    [Theory]
    [MemberData(nameof(PublishedTable))]
    public void For_SubgroupSize_MatchesPublishedTable(int n, double a2, double d3, double d4, double d2)
    {
        var c = ControlChartConstants.For(n);
        Assert.Equal(n, c.SubgroupSize);
        Assert.Equal(a2, c.A2, 1e-12);
        Assert.Equal(d3, c.D3, 1e-12);
        Assert.Equal(d4, c.D4, 1e-12);
        Assert.Equal(d2, c.SmallD2, 1e-12);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    public void SmallD2_EqualsExpectedRangeOfNormals(int n)
    {
        // d2(n) = ∫ [1 − Φ(x)ⁿ − (1 − Φ(x))ⁿ] dx, the expected range of n standard normals [derived];
        // integrated with MathNet.Numerics and its Normal.CDF, independent of the table.
        var d2 = Integrate.OnClosedInterval(
            x => 1 - Math.Pow(Normal.CDF(0, 1, x), n) - Math.Pow(1 - Normal.CDF(0, 1, x), n), -12, 12, 1e-10);
        Assert.Equal(d2, ControlChartConstants.For(n).SmallD2, 5e-4);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    public void A2_EqualsThreeOverD2RootN(int n)
    {
        // A2 = 3/(d2·√n) [derived from the X̄-chart limits X̿ ± 3σ/√n with σ̂ = R̄/d2].
        var c = ControlChartConstants.For(n);
        Assert.Equal(3 / (c.SmallD2 * Math.Sqrt(n)), c.A2, 1e-3);
    }

    [Fact]
    public void D4_SubgroupTwo_EqualsOnePlusThreeD3OverD2()
    {
        // For n = 2 the range is √2·|Z|: d2 = 2/√π, d3 = √2·√(1 − 2/π); D4 = 1 + 3·d3/d2 [derived].
        var d2 = 2 / Math.Sqrt(Math.PI);
        var d3 = Math.Sqrt(2) * Math.Sqrt(1 - (2 / Math.PI));
        Assert.Equal(1 + (3 * d3 / d2), ControlChartConstants.For(2).D4, 1e-3);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(6)]
    public void For_SizeOutsideTable_Throws(int n)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => ControlChartConstants.For(n));
    }
}
