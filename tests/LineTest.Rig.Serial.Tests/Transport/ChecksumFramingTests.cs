using System.Globalization;
using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class ChecksumFramingTests
{
    [Theory]
    [InlineData("ID?", "ID?*CC")] // 0x49 + 0x44 + 0x3F = 0xCC, worked by hand [derived]
    [InlineData("OK", "OK*9A")] // 0x4F + 0x4B = 0x9A [derived]
    [InlineData("STORE", "STORE*8D")] // 0x53+0x54+0x4F+0x52+0x45 = 0x18D, mod 256 = 0x8D [derived]
    public void Encode_Message_AppendsSumModulo256(string body, string line)
        => Assert.Equal(line, ChecksumFraming.Instance.Encode(body));

    [Theory]
    [InlineData("OK*9B", "does not match")]
    [InlineData("OK*9", "two-digit checksum")]
    [InlineData("OK", "two-digit checksum")]
    [InlineData("OK*ZZ", "not hexadecimal")]
    public void Decode_BadFrame_NotUnderstood(string line, string why)
    {
        var decoded = ChecksumFraming.Instance.Decode(line);

        Assert.Contains(why, decoded.Garbage, StringComparison.Ordinal);
    }

    [Fact]
    public void Decode_EncodedMessage_RoundTrips()
        => Gen.String[Gen.Char['+', '~'].Where(c => c != '*'), 0, 60]
            .Sample(body => Assert.Equal(body, ChecksumFraming.Instance.Decode(ChecksumFraming.Instance.Encode(body)).Value));

    [Fact]
    public void Decode_OneCharacterChanged_IsAlwaysCaught()
        => Gen.Select(Gen.String[Gen.Char['A', 'Z'], 1, 40], Gen.Int[0, 39], Gen.Char['A', 'Z'])
            .Where((body, at, c) => at < body.Length && body[at] != c)
            .Sample((body, at, c) =>
            {
                var line = ChecksumFraming.Instance.Encode(body);
                var changed = string.Concat(line.AsSpan(0, at), c.ToString(), line.AsSpan(at + 1));
                Assert.False(ChecksumFraming.Instance.Decode(changed).IsOk);
            });

    [Fact]
    [Trait("Category", "Fuzz")]
    public void Decode_RandomAndMutatedLines_OnlyFramesWithTheirChecksum()
    {
        var frames = Gen.String[Gen.Char[' ', '~'].Where(c => c != '*'), 0, 40].Select(ChecksumFraming.Instance.Encode);

        // Random messages of any characters with the checksum they would need, so the message checks are reached too.
        var summed = WireFuzz.Line.Select(body => string.Create(CultureInfo.InvariantCulture, $"{body}*{body.Sum(c => (int)c) % 256:X2}"));

        WireFuzz.MatchesGrammar(Gen.OneOf(WireFuzz.LinesAround(frames), summed), ChecksumFraming.Instance.Decode, ProtocolGrammar.Frame);
    }

    // Regression: found by fuzzing. ":*3a" was taken as the message ":" although the protocol sends upper-case digits;
    // "A*B*AD" has the checksum of its message "A*B", a message that cannot be encoded; and a control character inside a
    // message with a matching checksum passed as well.
    [Theory]
    [InlineData(":*3a", "two upper-case digits")]
    [InlineData("A*B*AD", "one '*'")]
    [InlineData("O\u0001K*9B", "printable ASCII")]
    public void Decode_ChecksumMatchesButFrameIsMalformed_NotUnderstood(string line, string why)
    {
        var decoded = ChecksumFraming.Instance.Decode(line);

        Assert.False(decoded.IsOk);
        Assert.Contains(why, decoded.Garbage, StringComparison.Ordinal);
    }
}
