using CsCheck;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Reference;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.Twins;

namespace LineTest.Rig.Serial.Tests.Reference;

public sealed class SerialReferenceReadoutTests
{
    [LinuxFact]
    public async Task ReadRawAsync_OhmsReply_ReturnsValueAfterSendingMeas()
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("138.5055,OHM"), name: "reference");
        var readout = new SerialReferenceReadout(port.Line, ReferenceCommands.Ohms);

        var raw = await readout.ReadRawAsync(default);

        Assert.Equal(138.5055, raw);
        Assert.Equal(["MEAS?"], port.Server.ReceivedLines);
    }

    [LinuxFact]
    public async Task ReadRawAsync_WrongUnit_GarbageReplyThatSaysWhichUnitIsNeeded()
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("4.096,MV"), name: "reference", retries: 0);
        var readout = new SerialReferenceReadout(port.Line, ReferenceCommands.Ohms);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => readout.ReadRawAsync(default));

        Assert.Equal(InstrumentFaultKind.GarbageReply, fault.Kind);
        Assert.Contains("reports MV but the fixture's sensor needs OHM", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ReadRawAsync_ErrorReply_InstrumentError()
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("ERR 210,probe open"), name: "reference");
        var readout = new SerialReferenceReadout(port.Line, ReferenceCommands.Ohms);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => readout.ReadRawAsync(default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("probe open", fault.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("prt", "OHM")]
    [InlineData("thermistor", "OHM")]
    [InlineData("thermocouple", "MV")]
    [InlineData("celsius", "CEL")]
    public void UnitFor_SensorKind_ReadoutUnit(string kind, string unit) => Assert.Equal(unit, ReferenceCommands.UnitFor(kind));

    [Theory]
    [InlineData("OHM")]
    [InlineData("MV")]
    [InlineData("CEL")]
    [Trait("Category", "Fuzz")]
    public void ParseMeasurement_RandomAndMutatedLines_ExactlyTheProtocolsReadings(string unit)
        => WireFuzz.MatchesGrammar(
            WireFuzz.LinesAround(Gen.OneOf(WireFuzz.FiniteDouble.Select(v => $"{Replies.Number(v)},{unit}"), Gen.Const("ERR 200,open sensor"))),
            reply => SerialReferenceReadout.ParseMeasurement(reply, unit),
            reply => ProtocolGrammar.Measurement(reply, unit));

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseMeasurement_TwinsReplyForm_RoundTrips()
        => WireFuzz.FiniteDouble.Sample(v => Assert.Equal(v, SerialReferenceReadout.ParseMeasurement($"{Replies.Number(v)},OHM", "OHM").Value), iter: WireFuzz.Iterations);

    // Regression: found by fuzzing. Line breaks before the value were skipped and the resistance taken.
    [Theory]
    [InlineData("\v-6.254E-14,OHM")]
    [InlineData("\n138.5,OHM")]
    [InlineData("\r0,OHM")]
    public void ParseMeasurement_GarbledValue_Garbage(string reply) => Assert.NotNull(SerialReferenceReadout.ParseMeasurement(reply, "OHM").Garbage);
}
