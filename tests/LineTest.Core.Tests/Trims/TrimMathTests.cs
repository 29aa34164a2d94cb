using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class TrimMathTests
{
    [Theory]
    [InlineData(2.5, 3.0)]
    [InlineData(-2.5, -3.0)]
    [InlineData(2.4999, 2.0)]
    public void RoundCode_HalfAwayFromZero(double ideal, double expected)
    {
        Assert.Equal(expected, TrimMath.RoundCode(ideal));
    }

    [Fact]
    public void ToDictionary_RepeatedSetpoint_GetsNumberedKeys()
    {
        var dictionary = TrimMath.ToDictionary(
        [
            new PredictedError("cold", 0, 0.1),
            new PredictedError("cold", 0, 0.2),
            new PredictedError("hot", 100, 0.3),
        ]);

        Assert.Equal(0.1, dictionary["cold"]);
        Assert.Equal(0.2, dictionary["cold#2"]);
        Assert.Equal(0.3, dictionary["hot"]);
    }
}
