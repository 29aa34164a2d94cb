using CsCheck;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Serial.UnitLink;
using LineTest.Rig.Simulation;
using System.Globalization;

namespace LineTest.Rig.Serial.Tests.UnitLink;

public sealed class SerialUnitLinkTests
{
    [LinuxFact]
    public async Task Commands_EachMethod_SendsChecksummedLinesByteForByte()
    {
        using var port = new ScriptedPort(cmd => TwinReply.Answer(cmd switch
        {
            "ID?" => "ID CTP40A-000123,CTP-40A,1.4.2",
            "RAW?" => "RAW -1234",
            "TEMP?" => "TEMP 21.5",
            "TRIM?" => "TRIM GAIN=2050,OFFSET=1990",
            _ => "OK",
        }), ChecksumFraming.Instance, name: "unit slot 1");
        var link = new SerialUnitLink(port.Line);

        var id = await link.IdentifyAsync(default);
        var raw = await link.ReadRawAsync(default);
        var temp = await link.ReadTemperatureAsync(default);
        await link.WriteTrimAsync(new Dictionary<string, long> { ["OFFSET"] = 1990, ["GAIN"] = 2050 }, default);
        await link.StoreAsync(default);
        var back = await link.ReadBackAsync(default);

        // Checksums: byte sums modulo 256, worked out independently of the framing code [derived].
        Assert.Equal(["ID?*CC", "RAW?*29", "TEMP?*75", "TRIM GAIN=2050,OFFSET=1990*82", "STORE*8D", "TRIM?*7B"], port.Server.ReceivedLines);
        Assert.Equal(new UnitIdentity("CTP40A-000123", "CTP-40A", "1.4.2"), id);
        Assert.Equal(-1234, raw);
        Assert.Equal(21.5, temp);
        Assert.Equal(2050, back["GAIN"]);
        Assert.Equal(1990, back["OFFSET"]);
    }

    [LinuxFact]
    public async Task WriteTrimAsync_Silent_NoAnswerAndWrittenOnlyOnce()
    {
        using var port = new ScriptedPort(_ => TwinReply.Silence, ChecksumFraming.Instance, timeoutMs: 150, retries: 3, name: "unit slot 2");
        var link = new SerialUnitLink(port.Line);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 1 }, default));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
        Assert.Single(port.Server.ReceivedLines);
    }

    [LinuxFact]
    public async Task ReadRawAsync_UnitGarbled_GarbageReplyNamingTheChecksum()
    {
        using var h = new SerialHarness(retries: 0);
        h.Load(UnitDefect.None);
        h.Rig.InjectFault(RigFault.UnitGarbage(1));

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => h.Serial.Instruments.UnitLinks[1].ReadRawAsync(default));

        Assert.Equal(InstrumentFaultKind.GarbageReply, fault.Kind);
        Assert.Contains("does not match its message", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task WriteTrimAsync_CodeOutOfRange_InstrumentErrorFromTheUnit()
    {
        using var h = new SerialHarness();
        h.Load(UnitDefect.None);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() =>
            h.Serial.Instruments.UnitLinks[1].WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 1_000_000 }, default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("GAIN = 1000000", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task TrimStoreReadBack_OverSerial_UnitHoldsTheStoredCodes()
    {
        using var h = new SerialHarness();
        var unit = h.Load(UnitDefect.None)[0];
        var link = h.Serial.Instruments.UnitLinks[1];

        await link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 2100, ["OFFSET"] = 1900 }, default);
        await link.StoreAsync(default);
        var back = await link.ReadBackAsync(default);
        var id = await link.IdentifyAsync(default);

        Assert.Equal(2100, back["GAIN"]);
        Assert.Equal(1900, back["OFFSET"]);
        Assert.Equal(unit.Serial, id.Serial);
    }

    [Fact]
    public void TrimList_BadRegisterName_ArgumentExceptionBeforeSending()
        => Assert.Throws<ArgumentException>(() => UnitLinkCommands.TrimList(new Dictionary<string, long> { ["gain*"] = 1 }));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseOk_RandomAndMutatedLines_OnlyOkOrError()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Gen.OneOf("OK", "ERR unit rejected GAIN")), SerialUnitLink.ParseOk, ProtocolGrammar.UnitOk);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseIdentity_RandomAndMutatedLines_ExactlyThreeFields()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Gen.OneOf("ID CTP40A-2612-000001,CTP-40A,1.2", "ERR busy")),
            SerialUnitLink.ParseIdentity, reply => ProtocolGrammar.UnitReply(reply, "ID", ProtocolGrammar.UnitIdentity));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseRaw_RandomAndMutatedLines_ExactlyWholeCounts()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Gen.Long.Select(n => string.Create(CultureInfo.InvariantCulture, $"RAW {n}"))),
            SerialUnitLink.ParseRaw, reply => ProtocolGrammar.UnitReply(reply, "RAW", ProtocolGrammar.Counts));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseTemperature_RandomAndMutatedLines_ExactlyFiniteNumbers()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(WireFuzz.FiniteDouble.Select(c => $"TEMP {Replies.Number(c)}")),
            SerialUnitLink.ParseTemperature, reply => ProtocolGrammar.UnitReply(reply, "TEMP", ProtocolGrammar.FiniteNumber));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseTrim_RandomAndMutatedLines_ExactlyRegisterLists()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(TrimValues.Select(UnitLinkCommands.TrimList)),
            SerialUnitLink.ParseTrim, reply => ProtocolGrammar.UnitReply(reply, "TRIM", ProtocolGrammar.TrimList), (a, b) => a.OrderBy(p => p.Key).SequenceEqual(b.OrderBy(p => p.Key)));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseReplies_TwinsReplyForms_RoundTrip()
        => Gen.Select(TrimValues, Gen.Long, WireFuzz.FiniteDouble).Sample((values, counts, celsius) =>
        {
            Assert.Equal(values.OrderBy(p => p.Key), SerialUnitLink.ParseTrim(UnitLinkCommands.TrimList(values)).Value!.OrderBy(p => p.Key));
            Assert.Equal(counts, SerialUnitLink.ParseRaw(string.Create(CultureInfo.InvariantCulture, $"RAW {counts}")).Value);
            Assert.Equal(celsius, SerialUnitLink.ParseTemperature($"TEMP {Replies.Number(celsius)}").Value);
        }, iter: WireFuzz.Iterations);

    private static readonly Gen<IReadOnlyDictionary<string, long>> TrimValues =
        Gen.Dictionary(Gen.String[Gen.Char['A', 'Z'], 1, 1].SelectMany(first => Gen.String[Gen.OneOf(Gen.Char['A', 'Z'], Gen.Char['0', '9'], Gen.Const('_')), 0, 8].Select(rest => first + rest)), Gen.Long)[1, 6]
            .Select(d => (IReadOnlyDictionary<string, long>)d);

    // Regression: found by fuzzing. The register-name pattern ended in $, which also matches before a final line feed,
    // so "C\n" passed as a name in a read-back (and could have been written to a unit, splitting the command line).
    [Fact]
    public void ParseTrim_RegisterNameEndingInLineFeed_Garbage()
        => Assert.NotNull(SerialUnitLink.ParseTrim("TRIM AX=-7560372,C\n=16597,Y1=-10785").Garbage);

    [Fact]
    public void TrimList_RegisterNameEndingInLineFeed_Refused()
        => Assert.Throws<ArgumentException>(() => UnitLinkCommands.TrimList(new Dictionary<string, long> { ["GAIN\n"] = 1 }));

    // Regression: found by fuzzing. A carriage return before the temperature, or NULs after the counts, were skipped.
    [Theory]
    [InlineData("TEMP \r-1")]
    [InlineData("TEMP 21.5\0")]
    [InlineData("TEMP ERR 5")]
    public void ParseTemperature_GarbledReply_Garbage(string reply) => Assert.NotNull(SerialUnitLink.ParseTemperature(reply).Garbage);

    [Theory]
    [InlineData("RAW 1234\0")]
    [InlineData("RAW  1234")]
    [InlineData("RAW 12 34")]
    public void ParseRaw_GarbledCounts_Garbage(string reply) => Assert.NotNull(SerialUnitLink.ParseRaw(reply).Garbage);
}
