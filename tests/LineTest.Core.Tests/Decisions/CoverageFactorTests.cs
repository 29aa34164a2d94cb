using LineTest.Core.Decisions;

namespace LineTest.Core.Tests.Decisions;

public sealed class CoverageFactorTests
{
    [Theory]
    // JCGM 100:2008 Table G.2, t_p(ν) for p = 95.45 % [published].
    [InlineData(1.0, 13.97)]
    [InlineData(2.0, 4.53)]
    [InlineData(3.0, 3.31)]
    [InlineData(4.0, 2.87)]
    [InlineData(5.0, 2.65)]
    [InlineData(9.0, 2.32)]
    [InlineData(10.0, 2.28)]
    [InlineData(20.0, 2.13)]
    [InlineData(50.0, 2.05)]
    public void ForDegreesOfFreedom_GumTableG2_MatchesToTwoDecimals(double nu, double expected)
    {
        Assert.Equal(expected, CoverageFactor.ForDegreesOfFreedom(nu), 2);
    }

    [Fact]
    public void ForDegreesOfFreedom_Infinite_IsTwo()
    {
        Assert.Equal(2.0, CoverageFactor.ForDegreesOfFreedom(null));
    }

    [Fact]
    public void ForDegreesOfFreedom_BelowOne_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => CoverageFactor.ForDegreesOfFreedom(0.5));
    }
}
