using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ResistanceTextTests
{
    [Theory]
    [InlineData(12100.0, 3, "12.1 kΩ")]
    [InlineData(4700.0, 2, "4.7 kΩ")]
    [InlineData(470.0, 2, "470 Ω")]
    [InlineData(1_500_000.0, 2, "1.5 MΩ")]
    [InlineData(1000.0, 3, "1 kΩ")]
    [InlineData(4.7, 2, "4.7 Ω")]
    [InlineData(0.47, 2, "470 mΩ")]
    [InlineData(9382.716, 4, "9.383 kΩ")]
    [InlineData(999_960.0, 4, "1 MΩ")]
    public void Format_UsesSIPrefixAndSignificantDigits(double ohms, int digits, string expected)
    {
        Assert.Equal(expected, ResistanceText.Format(ohms, digits));
    }
}
