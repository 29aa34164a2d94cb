using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Meter;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Serial.Tests.Meter;

public sealed class ScpiVoltmeterTests
{
    [LinuxFact]
    public async Task ReadDcVoltsAsync_FirstReading_ResetsConfiguresChecksQueueThenReads()
    {
        using var h = new SerialHarness();
        h.Load(UnitDefect.None);
        var meter = h.Serial.Drivers.Meter;

        var first = await meter.ReadDcVoltsAsync(101, default);
        var second = await meter.ReadDcVoltsAsync(111, default);

        Assert.Equal(
            ["*RST", "*CLS", "CONF:VOLT:DC 10", "VOLT:DC:NPLC 1", "SYST:ERR?", "ROUT:CLOS (@101);:READ?", "ROUT:CLOS (@111);:READ?"],
            h.Serial.Meter.Server.ReceivedLines);
        Assert.InRange(first, 0.1, 5);
        Assert.InRange(second, 0.001, 1);
    }

    [LinuxFact]
    public async Task ReadDcVoltsAsync_OverSerial_SameValueAsTheSimulatorBitForBit()
    {
        using var serial = new SerialHarness(seed: 3);
        using var direct = new SerialHarness(seed: 3);
        serial.Load(UnitDefect.None);
        direct.Load(UnitDefect.None);

        var viaPort = await serial.Serial.Instruments.Meter.ReadDcVoltsAsync(101, default);
        var inMemory = await direct.Rig.Meter.ReadDcVoltsAsync(101, default);

        Assert.Equal(BitConverter.DoubleToInt64Bits(inMemory), BitConverter.DoubleToInt64Bits(viaPort));
    }

    [LinuxFact]
    public async Task ReadDcVoltsAsync_MeterRefusesReadings_InstrumentErrorQuotingTheErrorQueue()
    {
        using var h = new SerialHarness(retries: 0, timeouts: new() { ["meter"] = 200 });
        h.Load(UnitDefect.None);
        await h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default);
        h.Serial.Meter.RefuseReadings(ScpiCommands.ErrorEntry(-240, "Hardware error; input stage"));

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("-240,\"Hardware error; input stage\"", fault.Message, StringComparison.Ordinal);
        Assert.EndsWith("SYST:ERR?", h.Serial.Meter.Server.ReceivedLines[^2], StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ConfigureAsync_RangeTheMeterDoesNotHave_InstrumentErrorNamingTheSetting()
    {
        using var h = new SerialHarness();
        var meter = new ScpiVoltmeter(h.Fixture.Meter with { RangeVolts = 7 }, h.Serial.Drivers.Meter.Line);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => meter.ConfigureAsync(default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("CONF:VOLT:DC 7", fault.Message, StringComparison.Ordinal);
        Assert.Contains("-222", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ReadDcVoltsAsync_Silent_NoAnswerAfterRetries()
    {
        using var h = new SerialHarness(timeouts: new() { ["meter"] = 200 });
        await h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default);
        h.Rig.InjectFault(RigFault.MeterSilent());

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
        Assert.Contains("no answer within 200 ms to 'ROUT:CLOS (@101);:READ?'", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ReadDcVoltsAsync_Garbage_GarbageReplyNamingTheByte()
    {
        using var h = new SerialHarness(retries: 0);
        await h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default);
        h.Rig.InjectFault(RigFault.MeterGarbage());

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => h.Serial.Drivers.Meter.ReadDcVoltsAsync(101, default));

        Assert.Equal(InstrumentFaultKind.GarbageReply, fault.Kind);
        Assert.Contains("non-printable byte 0x7F", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ReadDcVoltsAsync_PortLostThenBack_ReopensAndReconfiguresBeforeReading()
    {
        using var h = new SerialHarness(retries: 0, timeouts: new() { ["meter"] = 200 });
        var meter = h.Serial.Drivers.Meter;
        await meter.ReadDcVoltsAsync(101, default);
        h.Rig.InjectFault(RigFault.MeterPortLost());

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => meter.ReadDcVoltsAsync(101, default));
        Assert.Equal(InstrumentFaultKind.PortLost, fault.Kind);
        Assert.False(h.Serial.Meter.Server.IsPlugged);

        h.Rig.ClearFaults();
        h.Serial.Meter.Server.Replug();
        var volts = await meter.ReadDcVoltsAsync(101, default);

        Assert.True(double.IsFinite(volts));
        Assert.Equal(["*RST", "*CLS", "CONF:VOLT:DC 10", "VOLT:DC:NPLC 1", "SYST:ERR?", "ROUT:CLOS (@101);:READ?"], h.Serial.Meter.Server.ReceivedLines.TakeLast(6));
    }

    [Theory]
    [InlineData("+0,\"No error\"", null)]
    [InlineData("-113,\"Undefined header\"", "-113,\"Undefined header\"")]
    public void ParseErrorEntry_Entry_NullOnlyForNoError(string reply, string? expected)
        => Assert.Equal(expected, ScpiVoltmeter.ParseErrorEntry(reply).Value);
}
