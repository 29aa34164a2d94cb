using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class SpecLimitsTests
{
    [Fact]
    public void Factories_SetTheRightSides()
    {
        Assert.True(SpecLimits.Between(1, 2).IsTwoSided);
        Assert.Equal(1.0, SpecLimits.AtLeast(1).Lower);
        Assert.Null(SpecLimits.AtLeast(1).Upper);
        Assert.Equal(2.0, SpecLimits.AtMost(2).Upper);
        Assert.Null(SpecLimits.AtMost(2).Lower);
    }

    [Fact]
    public void Constructor_LowerNotBelowUpper_Throws()
    {
        var ex = Assert.Throws<ArgumentException>(() => SpecLimits.Between(5, 5));
        Assert.Contains("must be below", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Constructor_NonFiniteLimit_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecLimits.AtMost(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecLimits.AtLeast(double.NegativeInfinity));
    }
}
