using CsCheck;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Source;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.Twins;

namespace LineTest.Rig.Serial.Tests.Source;

public sealed class SerialTemperatureSourceTests
{
    private static readonly SourceDefinition Definition = new()
    {
        SafeMinC = -30,
        SafeMaxC = 125,
        StandbyC = 23,
        RampUpCPerMinute = 15,
        RampDownCPerMinute = 10,
        SettlingTimeConstantSeconds = 40,
    };

    [LinuxFact]
    public async Task Commands_EachMethod_SendsExactLinesAndParsesReplies()
    {
        using var port = new ScriptedPort(cmd => TwinReply.Answer(cmd switch
        {
            "*IDN?" => "Maker,Block 9,SN7,2.1",
            "SOUR:TEMP?" => "49.987",
            "SOUR:STAT?" => "50,49.987,OK",
            _ => "OK",
        }));
        var source = new SerialTemperatureSource(Definition, port.Line);

        var identity = await source.IdentifyAsync(default);
        await source.SetSetpointAsync(-12.5, default);
        var actual = await source.ReadTemperatureAsync(default);
        var status = await source.ReadStatusAsync(default);
        await source.GoToStandbyAsync(default);

        Assert.Equal(["*IDN?", "SOUR:SETP -12.5", "SOUR:TEMP?", "SOUR:STAT?", "SOUR:STBY"], port.Server.ReceivedLines);
        Assert.Equal("Block 9", identity.Model);
        Assert.Equal(49.987, actual);
        Assert.Equal(new SourceStatus(50, 49.987, null), status);
    }

    [LinuxFact]
    public async Task ReadStatusAsync_FaultField_CarriesTheSourcesText()
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("23,30.5,FAULT heater open"));
        var source = new SerialTemperatureSource(Definition, port.Line);

        var status = await source.ReadStatusAsync(default);

        Assert.Equal("heater open", status.Fault);
    }

    [LinuxTheory]
    [InlineData(125.01)]
    [InlineData(-30.5)]
    [InlineData(double.NaN)]
    public async Task SetSetpointAsync_OutsideSafeRange_RefusedBeforeAnythingIsSent(double celsius)
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("OK"));
        var source = new SerialTemperatureSource(Definition, port.Line);

        var refused = await Assert.ThrowsAsync<InstrumentFaultException>(() => source.SetSetpointAsync(celsius, default));

        Assert.Equal(InstrumentFaultKind.Other, refused.Kind);
        Assert.Contains("safe range -30 to 125 °C; nothing was sent", refused.Message, StringComparison.Ordinal);
        await Task.Delay(50);
        Assert.Empty(port.Server.ReceivedLines);
    }

    [LinuxFact]
    public async Task SetSetpointAsync_ErrorReply_InstrumentErrorSentOnce()
    {
        using var port = new ScriptedPort(_ => TwinReply.Answer("ERR 301,heater fault"), retries: 2);
        var source = new SerialTemperatureSource(Definition, port.Line);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => source.SetSetpointAsync(50, default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("'301,heater fault'", fault.Message, StringComparison.Ordinal);
        Assert.Single(port.Server.ReceivedLines);
    }

    [LinuxFact]
    public async Task GoToStandbyAsync_Silent_NoAnswerAndNotRepeated()
    {
        using var port = new ScriptedPort(_ => TwinReply.Silence, timeoutMs: 300, retries: 2);
        var source = new SerialTemperatureSource(Definition, port.Line);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => source.GoToStandbyAsync(default));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
        Assert.StartsWith($"source on {port.Server.PortName}: no answer within 300 ms to 'SOUR:STBY'", fault.Message, StringComparison.Ordinal);
        Assert.Equal(["SOUR:STBY"], port.Server.ReceivedLines);
    }

    [Theory]
    [InlineData("50,49.9")]
    [InlineData("50,x,OK")]
    [InlineData("50,49.9,BROKEN")]
    [InlineData("50,49.9,FAULT ")]
    public void ParseStatus_Malformed_NotUnderstood(string reply)
    {
        var parsed = SerialTemperatureSource.ParseStatus(reply);

        Assert.NotNull(parsed.Garbage);
    }

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseStatus_RandomAndMutatedLines_ExactlyTheProtocolsStatuses()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Statuses.Select(Format)), SerialTemperatureSource.ParseStatus, ProtocolGrammar.Status);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseStatus_TwinsReplyForm_RoundTrips()
        => Statuses.Sample(status => Assert.Equal(status, SerialTemperatureSource.ParseStatus(Format(status)).Value), iter: WireFuzz.Iterations);

    private static readonly Gen<SourceStatus> Statuses = Gen.Select(
        WireFuzz.FiniteDouble, WireFuzz.FiniteDouble, Gen.OneOf(Gen.Const((string?)null), Gen.String[Gen.Char[' ', '~'], 1, 30].Select(f => (string?)f)),
        (setpoint, actual, fault) => new SourceStatus(setpoint, actual, fault));

    // The twin's form of a status reply (SourceTwin).
    private static string Format(SourceStatus s)
        => $"{Replies.Number(s.SetpointC)},{Replies.Number(s.ActualC)},{(s.Fault is null ? SourceCommands.NoFault : SourceCommands.FaultPrefix + s.Fault)}";

    // Regression: found by fuzzing. A vertical tab after the setpoint was skipped and the status taken.
    [Theory]
    [InlineData("5.52919350585993E+49\v,-2.424388975511081E+49,OK")]
    [InlineData("50,49.9\0,OK")]
    public void ParseStatus_GarbledNumber_Garbage(string reply) => Assert.NotNull(SerialTemperatureSource.ParseStatus(reply).Garbage);
}
