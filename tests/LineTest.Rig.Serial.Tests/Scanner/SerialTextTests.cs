using LineTest.Rig.Serial.Scanner;

namespace LineTest.Rig.Serial.Tests.Scanner;

public sealed class SerialTextTests
{
    [Theory]
    [InlineData("A", "A")]
    [InlineData(" lot_7/unit.03 ", "lot_7/unit.03")]
    public void Check_GoodSerial_Trimmed(string line, string serial) => Assert.Equal(serial, SerialText.Check(line).Serial);

    [Theory]
    [InlineData("", "empty")]
    [InlineData("CTP40A\u0007", "\\u0007")]
    [InlineData("0123456789012345678901234567890123456789X", "at most 40")]
    public void Check_BadSerial_RejectedWithReason(string line, string why) => Assert.Contains(why, SerialText.Check(line).Problem, StringComparison.Ordinal);
}
