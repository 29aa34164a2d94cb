using CsCheck;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.SourceMeter;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Serial.Tests.SourceMeter;

public sealed class ScpiSourceMeterTests
{
    [LinuxFact]
    public async Task SetCurrentAndMeasure_FirstUse_ConfiguresThenSourcesAndReadsTheDiode()
    {
        using var h = new SerialHarness();
        var units = h.Load(UnitDefect.None);
        var smu = h.Serial.Drivers.SourceMeter!;

        await smu.SetCurrentAsync(1, 10e-6, 2.5, default);
        var reading = await smu.MeasureVoltsAsync(default);
        await smu.OutputOffAsync(default);
        var off = await smu.MeasureVoltsAsync(default);

        // A setting has no reply: the query after it shows the twin has taken it.
        Assert.Equal(
            ["*RST", "*CLS", "SOUR:FUNC CURR", "OUTP OFF", "SYST:ERR?", "ROUT:CLOS (@1);:SENS:VOLT:PROT 2.5;:SOUR:CURR 1E-05;:OUTP ON", "SYST:ERR?", "READ?", "OUTP OFF", "READ?"],
            h.Serial.SourceMeter!.Server.ReceivedLines);
        Assert.False(h.Rig.SourceMeter!.OutputOn);
        Assert.InRange(off.Volts, -0.001, 0.001);
        Assert.False(reading.InCompliance);

        // The simulated diode at 10 µA near room temperature, within 1 mV of its noise-free forward voltage.
        var unit = units[0];
        Assert.Equal(unit.Parameters.Diode.ForwardVolts(unit.SensorC, 10e-6), reading.Volts, 0.001);
    }

    [LinuxFact]
    public async Task MeasureVoltsAsync_OpenSensor_ReportsComplianceAtTheLimit()
    {
        using var h = new SerialHarness();
        h.Load(UnitDefect.OpenSensor);
        var smu = h.Serial.Drivers.SourceMeter!;

        await smu.SetCurrentAsync(1, 1e-6, 2.0, default);
        var reading = await smu.MeasureVoltsAsync(default);

        Assert.True(reading.InCompliance);
        Assert.Equal(2.0, reading.Volts);
    }

    [LinuxFact]
    public async Task SetCurrentAsync_ChannelNotWired_InstrumentErrorQuotingTheQueue()
    {
        using var h = new SerialHarness(retries: 0);
        h.Load(UnitDefect.None);
        var smu = h.Serial.Drivers.SourceMeter!;

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => smu.SetCurrentAsync(9, 1e-6, 2.0, default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("channel 9 is not wired", fault.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("6.1234E-01,0", 0.61234, false)]
    [InlineData("2.5E+00,1", 2.5, true)]
    public void ParseReading_WellFormed_GivesVoltsAndFlag(string reply, double volts, bool compliance)
    {
        var parsed = ScpiSourceMeter.ParseReading(reply);

        Assert.True(parsed.IsOk);
        Assert.Equal(new SourceMeterReading(volts, compliance), parsed.Value);
    }

    [Theory]
    [InlineData("0.61234")]
    [InlineData("0.61,2")]
    [InlineData("volts,0")]
    [InlineData(",1")]
    public void ParseReading_Malformed_IsNotUnderstood(string reply)
    {
        Assert.False(ScpiSourceMeter.ParseReading(reply).IsOk);
    }

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseReading_RandomAndMutatedLines_ExactlyVoltsCommaFlag()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Readings.Select(r => SourceMeterCommands.Reading(r.Volts, r.InCompliance))),
            ScpiSourceMeter.ParseReading, ProtocolGrammar.SourceMeterReading);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void ParseReading_TwinsReplyForm_RoundTrips()
        => Readings.Sample(r => Assert.Equal(r, ScpiSourceMeter.ParseReading(SourceMeterCommands.Reading(r.Volts, r.InCompliance)).Value), iter: WireFuzz.Iterations);

    private static readonly Gen<SourceMeterReading> Readings = Gen.Select(WireFuzz.FiniteDouble, Gen.Bool, (v, c) => new SourceMeterReading(v, c));

    // Regression: found by fuzzing. A vertical tab (or another line break) before the volts, or a NUL after them, was
    // skipped by double.TryParse and the reading taken.
    [Theory]
    [InlineData("\v3.3311111111111110E+001,1")]
    [InlineData("6.1E-01\0,0")]
    [InlineData("6.1E-01,\u00A01")]
    [InlineData("Infinity,0")]
    public void ParseReading_GarbledReading_Garbage(string reply) => Assert.NotNull(ScpiSourceMeter.ParseReading(reply).Garbage);
}
