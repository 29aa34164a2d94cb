using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedVoltmeterTests
{
    private static readonly CancellationToken None = CancellationToken.None;

    [Fact]
    public async Task ReadDcVoltsAsync_EmptySlotOrUnwiredChannel_ReadsAboutZero()
    {
        var rig = SimulatedFixtures.Rig();

        var emptyOutput = await rig.Meter.ReadDcVoltsAsync(3, None);
        var emptySupply = await rig.Meter.ReadDcVoltsAsync(103, None);
        var unwired = await rig.Meter.ReadDcVoltsAsync(40, None);

        Assert.All(new[] { emptyOutput, emptySupply, unwired }, v => Assert.InRange(v, -0.00002, 0.00002));
    }

    [Fact]
    public async Task ReadDcVoltsAsync_SupplyChannel_IsSupplyCurrentTimesShunt()
    {
        var rig = SimulatedFixtures.Rig();
        var unit = SimulatedFixtures.Factory().NextUnit();
        rig.Load(1, unit);

        var volts = await rig.Meter.ReadDcVoltsAsync(101, None);

        // 2.5 mA nominal through 10 Ω ≈ 25 mV.
        Assert.Equal(unit.Parameters.SupplyCurrentAmps * 10, volts, 0.00002);
        Assert.InRange(volts / 10, 0.0024, 0.0026);
    }

    [Fact]
    public async Task ReadDcVoltsAsync_Output_IsRoundedToResolution()
    {
        var rig = SimulatedFixtures.Rig();
        rig.Load(1, SimulatedFixtures.Factory().NextUnit(UnitDefect.None));

        var volts = await rig.Meter.ReadDcVoltsAsync(1, None);
        var steps = volts / 0.000001;

        Assert.Equal(Math.Round(steps), steps, 6);
    }

    [Fact]
    public async Task ReadDcVoltsAsync_UnitInSteadyBlock_ReadsItsSettledOutput()
    {
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(clock: clock);
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.None);
        await rig.Block.SetSetpointAsync(40, None);
        rig.Load(4, unit);
        clock.Advance(TimeSpan.FromHours(1));

        var volts = await rig.Meter.ReadDcVoltsAsync(4, None);

        Assert.Equal(unit.TrueOutputVolts(40), volts, 0.0003);
    }

    [Fact]
    public async Task ReadDcVoltsAsync_ChannelZero_InstrumentError()
    {
        var rig = SimulatedFixtures.Rig();

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Meter.ReadDcVoltsAsync(0, None));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
    }

    [Fact]
    public void MeasurementSeconds_OnePlc_IsTwentyMilliseconds()
    {
        var rig = SimulatedFixtures.Rig();

        Assert.Equal(0.020, rig.Meter.MeasurementSeconds, 12);
    }
}
