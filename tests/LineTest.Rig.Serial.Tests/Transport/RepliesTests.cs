using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class RepliesTests
{
    private static readonly Gen<string> ValidNumbers = Gen.OneOf(
        WireFuzz.FiniteDouble.Select(Replies.Number),
        WireFuzz.FiniteDouble.Select(LineTest.Rig.Serial.Meter.ScpiCommands.Nr3),
        Gen.OneOf("12.5", " -0.75\t", "+.5", "5.", "1e3", "-2E-02"));

    [Theory]
    [InlineData("23.456", 23.456)]
    [InlineData("-1E-05", -1e-5)]
    [InlineData(" 7.5 ", 7.5)] // blanks around a number are allowed
    [InlineData("+.5", 0.5)]
    public void ParseNumber_Number_Value(string reply, double value) => Assert.Equal(value, Replies.ParseNumber(reply).Value);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseNumber_RandomAndMutatedLines_ExactlyTheProtocolsNumbers()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(ValidNumbers), Replies.ParseNumber, ProtocolGrammar.NumberOrError);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseNumber_FormattedNumber_RoundTrips()
        => WireFuzz.FiniteDouble.Sample(value => Assert.Equal(value, Replies.ParseNumber(Replies.Number(value)).Value), iter: WireFuzz.Iterations);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseOk_RandomAndMutatedLines_OnlyOkOrError()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Gen.OneOf("OK", "ERR 103,setpoint outside")), Replies.ParseOk, ProtocolGrammar.OkOrError);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseIdentity_RandomAndMutatedLines_FourFieldsOrGarbage()
        => WireFuzz.MatchesGrammar(
            WireFuzz.LinesAround(Gen.OneOf("Maker,Block 9,SN7,2.1", "ERR 100,unknown")),
            Replies.ParseIdentity,
            line => line.StartsWith("ERR ", StringComparison.Ordinal) ? Expected<InstrumentIdentity>.Refused(line[4..].Trim()) : ProtocolGrammar.Identity(line));

    // Regression: found by fuzzing. double.TryParse takes trailing NULs, line breaks and other white space around a
    // number, so these garbled replies passed for plausible temperatures; the names of special values are not numbers either.
    [Theory]
    [InlineData("1e-400\0")]
    [InlineData("12.5\0\0")]
    [InlineData("\v7.5")]
    [InlineData("7.5\n")]
    [InlineData("\r-1")]
    [InlineData("7.5\u00A0")]
    [InlineData("Infinity")]
    [InlineData("-\u221E")]
    [InlineData("NaN")]
    [InlineData("1E400")]
    [InlineData("\u0661\u0662")]
    public void ParseNumber_GarbledNumber_Garbage(string reply)
        => Assert.Equal("not a number", Replies.ParseNumber(reply).Garbage);
}
