using CsCheck;
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

    [Fact]
    [Trait("Category", "Fuzz")]
    public void Check_RandomAndMutatedLines_SerialExactlyWhenTheRuleSaysSo()
        => WireFuzz.LinesAround(Gen.OneOf("CTP40A-2612-000042", " lot_7/unit.03 ")).Sample(line =>
        {
            var scan = SerialText.Check(line);

            // The rule, written out again: white space around is dropped; 1 to 40 of A–Z a–z 0–9 - _ . / remain.
            var trimmed = line.Trim();
            var valid = trimmed.Length is >= 1 and <= 40 && trimmed.All(c => c is (>= 'A' and <= 'Z') or (>= 'a' and <= 'z') or (>= '0' and <= '9') or '-' or '_' or '.' or '/');
            Assert.Equal(valid ? trimmed : null, scan.Serial);
            Assert.Equal(!valid, scan.Problem is { Length: > 0 });
            Assert.False(scan.EndOfInput);
        }, iter: WireFuzz.Iterations, print: WireFuzz.Show);
}
