using LineTest.Station.Cli;

namespace LineTest.Station.Tests.Cli;

public sealed class AccuracyCommandTests
{
    // Regression: the table printed "-+0.0000" for a mean such as -0.00001 °C (a negative number that rounds to zero
    // at four decimals picked the positive section of the format and kept its minus sign).
    [Theory]
    [InlineData(-0.00001, "+0.0000")]
    [InlineData(-0.0, "+0.0000")]
    [InlineData(0.00004, "+0.0000")]
    [InlineData(-0.00005001, "-0.0001")]
    [InlineData(0.0123456, "+0.0123")]
    [InlineData(-0.2125, "-0.2125")]
    public void Signed_ValueNearZero_OneSignOnly(double value, string expected) =>
        Assert.Equal(expected, AccuracyCommand.Signed(value));
}
