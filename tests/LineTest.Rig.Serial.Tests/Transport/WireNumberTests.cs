using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class WireNumberTests
{
    [Theory]
    [InlineData("0", 0.0)]
    [InlineData("-7.2072700000000000E-001", -0.720727)]
    [InlineData("\t+12.5 ", 12.5)]
    [InlineData("5.", 5.0)]
    [InlineData(".5e+1", 5.0)]
    public void TryParseDecimal_ProtocolNumber_Value(string text, double value)
    {
        Assert.True(WireNumber.TryParseDecimal(text, out var parsed));
        Assert.Equal(value, parsed);
    }

    [Fact]
    public void TryParseDecimal_ExponentBeyondDouble_InfiniteForTheCallerToJudge()
    {
        Assert.True(WireNumber.TryParseDecimal("-1E400", out var value));
        Assert.Equal(double.NegativeInfinity, value);
    }

    [Theory]
    [InlineData("")]
    [InlineData(".")]
    [InlineData("+")]
    [InlineData("1e")]
    [InlineData("1e+")]
    [InlineData("e5")]
    [InlineData("1 2")]
    [InlineData("1,5")]
    [InlineData("0x1F")]
    [InlineData("Infinity")]
    [InlineData("NaN")]
    [InlineData("12.5\0")]
    [InlineData("\n12.5")]
    public void TryParseDecimal_NotAProtocolNumber_False(string text) => Assert.False(WireNumber.TryParseDecimal(text, out _));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void TryParseDecimal_RandomAndMutatedText_ExactlyTheGrammar()
        => WireFuzz.MatchesGrammar(
            WireFuzz.LinesAround(WireFuzz.FiniteDouble.Select(Replies.Number)),
            text => WireNumber.TryParseDecimal(text, out var value) ? ReplyParse<double>.Ok(value) : ReplyParse<double>.NotUnderstood("no"),
            ProtocolGrammar.Nr3);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void TryParseWhole_RandomAndMutatedText_ExactlySignAndDigitsThatFit()
        => WireFuzz.MatchesGrammar(
            WireFuzz.LinesAround(Gen.Long.Select(n => n.ToString(System.Globalization.CultureInfo.InvariantCulture))),
            text => WireNumber.TryParseWhole(text, out var value) ? ReplyParse<long>.Ok(value) : ReplyParse<long>.NotUnderstood("no"),
            ProtocolGrammar.Counts);
}
