using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedRigTests
{
    private static readonly CancellationToken None = CancellationToken.None;

    public static TheoryData<RigFault, InstrumentFaultKind> MeterFaults => new()
    {
        { RigFault.MeterSilent(), InstrumentFaultKind.NoAnswer },
        { RigFault.MeterGarbage(), InstrumentFaultKind.GarbageReply },
        { RigFault.MeterPortLost(), InstrumentFaultKind.PortLost },
    };

    [Theory]
    [MemberData(nameof(MeterFaults))]
    public async Task InjectFault_Meter_ReadsFailWithMatchingKindUntilCleared(RigFault fault, InstrumentFaultKind expected)
    {
        var rig = SimulatedFixtures.Rig();

        rig.InjectFault(fault);
        var error = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Meter.ReadDcVoltsAsync(1, None));
        rig.ClearFaults();

        Assert.Equal(expected, error.Kind);
        Assert.Equal("meter", error.Instrument);
        await rig.Instruments.Meter.ReadDcVoltsAsync(1, None);
    }

    [Fact]
    public async Task InjectFault_AfterCommands_LetsThatManyThroughFirst()
    {
        var rig = SimulatedFixtures.Rig();
        rig.InjectFault(RigFault.MeterSilent(afterCommands: 3));

        for (var i = 0; i < 3; i++)
        {
            await rig.Instruments.Meter.ReadDcVoltsAsync(1, None);
        }

        await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Meter.ReadDcVoltsAsync(1, None));
        await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Meter.ReadDcVoltsAsync(2, None));
    }

    [Fact]
    public async Task InjectFault_UnitSilentAfterCommands_StopsAnsweringMidRun()
    {
        var rig = SimulatedFixtures.Rig();
        var factory = SimulatedFixtures.Factory();
        rig.Load(3, factory.NextUnit(UnitDefect.None));
        rig.Load(1, factory.NextUnit(UnitDefect.None));
        var link = rig.Instruments.UnitLinks[3];
        rig.InjectFault(RigFault.UnitSilent(slot: 3, afterCommands: 2));

        await link.IdentifyAsync(None);
        await link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 2050 }, None);
        var error = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.StoreAsync(None));

        Assert.Equal(InstrumentFaultKind.NoAnswer, error.Kind);
        Assert.Equal("unit slot 3", error.Instrument);
        Assert.Equal(2048, (await rig.Instruments.UnitLinks[1].ReadBackAsync(None))["GAIN"]);
    }

    [Fact]
    public async Task InjectFault_UnitGarbage_GarbageReply()
    {
        var rig = SimulatedFixtures.Rig();
        rig.Load(1, SimulatedFixtures.Factory().NextUnit(UnitDefect.None));
        rig.InjectFault(RigFault.UnitGarbage(1));

        var error = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.UnitLinks[1].ReadRawAsync(None));

        Assert.Equal(InstrumentFaultKind.GarbageReply, error.Kind);
    }

    [Fact]
    public async Task InjectFault_SourceSilent_AllSourceCommandsNoAnswer()
    {
        var rig = SimulatedFixtures.Rig();
        rig.InjectFault(RigFault.SourceSilent());

        var read = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Source.ReadTemperatureAsync(None));
        var standby = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Source.GoToStandbyAsync(None));

        Assert.Equal(InstrumentFaultKind.NoAnswer, read.Kind);
        Assert.Equal(InstrumentFaultKind.NoAnswer, standby.Kind);
        Assert.Equal("source", read.Instrument);
    }

    [Fact]
    public async Task InjectFault_HeaterFault_StatusReportsItSetpointRefusedBlockDriftsToAmbient()
    {
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(clock: clock);
        await rig.Instruments.Source.SetSetpointAsync(80, None);
        clock.Advance(TimeSpan.FromHours(1));

        rig.InjectFault(RigFault.SourceHeaterFault());
        clock.Advance(TimeSpan.FromHours(2));
        var status = await rig.Instruments.Source.ReadStatusAsync(None);
        var refused = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Source.SetSetpointAsync(50, None));

        Assert.Equal("heater fault", status.Fault);
        Assert.Equal(SimulatedRig.DefaultAmbientC, status.ActualC, 0.01);
        Assert.Equal(InstrumentFaultKind.InstrumentError, refused.Kind);
        rig.ClearFaults();
        await rig.Instruments.Source.SetSetpointAsync(50, None);
    }

    [Fact]
    public async Task InjectFault_ReferenceSilent_NoAnswer()
    {
        var rig = SimulatedFixtures.Rig();
        rig.InjectFault(RigFault.ReferenceSilent());

        var error = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.Reference.ReadRawAsync(None));

        Assert.Equal(InstrumentFaultKind.NoAnswer, error.Kind);
        Assert.Equal("reference", error.Instrument);
    }

    [Fact]
    public async Task InjectFault_ReferenceDrift_ReadingDepartsAtRate()
    {
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(simulation: SimulatedFixtures.Simulation(blockNoiseC: 0), clock: clock);
        var before = await rig.Instruments.Reference.ReadRawAsync(None);

        rig.InjectFault(RigFault.ReferenceDrift(0.05));
        clock.Advance(TimeSpan.FromHours(4));
        var after = await rig.Instruments.Reference.ReadRawAsync(None);

        // Block held at standby; the readout is °C with 0.0005 °C noise: 4 h × 0.05 °C/h = 0.2 °C.
        Assert.Equal(0.2, after - before, 0.004);
    }

    [Fact]
    public void InjectFault_UnitFaultForMissingSlot_Throws()
    {
        var rig = SimulatedFixtures.Rig();

        Assert.Throws<ArgumentOutOfRangeException>(() => rig.InjectFault(RigFault.UnitSilent(slot: 9)));
    }

    [Fact]
    public void Load_OccupiedSlotOrSameUnitTwice_Throws()
    {
        var rig = SimulatedFixtures.Rig();
        var factory = SimulatedFixtures.Factory();
        var unit = factory.NextUnit();
        rig.Load(1, unit);

        Assert.Throws<InvalidOperationException>(() => rig.Load(1, factory.NextUnit()));
        Assert.Throws<InvalidOperationException>(() => rig.Load(2, unit));
        Assert.Throws<ArgumentOutOfRangeException>(() => rig.Load(5, factory.NextUnit()));
    }

    [Fact]
    public void Unload_LoadedUnit_ReturnsItAndEmptiesSlot()
    {
        var rig = SimulatedFixtures.Rig();
        var unit = SimulatedFixtures.Factory().NextUnit();
        rig.Load(4, unit);

        Assert.Same(unit, rig.Unload(4));
        Assert.Null(rig.UnitIn(4));
        Assert.Null(rig.Unload(4));
    }

    [Fact]
    public void Constructor_ChannelWiredTwice_ThrowsNamingBothUses()
    {
        var fixture = SimulatedFixtures.FourWellBlock() with
        {
            Slots = [new SlotDefinition { Slot = 1, OutputChannel = 1, SupplyChannel = 5 }, new SlotDefinition { Slot = 2, OutputChannel = 5, SupplyChannel = 6 }],
        };

        var error = Assert.Throws<ArgumentException>(() => new SimulatedRig(fixture, 1, SimulatedFixtures.Clock(), SimulatedFixtures.CelsiusReadout));

        Assert.Contains("channel 5 is wired twice (slot 1 supply and slot 2 output)", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Load_IntoSettledBlock_SensorFollowsWellWithFirstOrderLag()
    {
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(clock: clock);
        await rig.Instruments.Source.SetSetpointAsync(60, None);
        clock.Advance(TimeSpan.FromHours(1));
        var unit = SimulatedFixtures.Factory().NextUnit(UnitDefect.None);
        var tau = unit.Parameters.LagTimeConstantSeconds;
        var well = 60 + 0.015;

        rig.Load(3, unit);
        clock.Advance(TimeSpan.FromSeconds(tau));
        await rig.Instruments.Meter.ReadDcVoltsAsync(3, None);
        var afterOneTau = unit.SensorC;
        clock.Advance(TimeSpan.FromSeconds(tau));
        await rig.Instruments.Meter.ReadDcVoltsAsync(3, None);

        // First-order step response from ambient 23 °C: the error falls by e per time constant.
        Assert.Equal(well - ((well - 23) / Math.E), afterOneTau, 6);
        Assert.Equal(well - ((well - 23) / (Math.E * Math.E)), unit.SensorC, 6);
    }

    [Fact]
    public async Task AnySequenceOfCalls_SameSeed_IdenticalReadings()
    {
        var first = await RecordSession(seed: 77);
        var second = await RecordSession(seed: 77);
        var other = await RecordSession(seed: 78);

        Assert.Equal(first, second);
        Assert.NotEqual(first, other);
    }

    [Fact]
    public async Task TrimThroughInstruments_GoodUnits_VerifyWithinFewMillivoltsOfTarget()
    {
        // A whole two-point trim on the simulated rig: settle, read reference and units at 0 °C and 50 °C,
        // trim by the DacTrimSpec equations, write and store, verify at 25 °C.
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(seed: 5, clock: clock);
        var factory = SimulatedFixtures.Factory(seed: 6);
        var units = Enumerable.Range(1, 4).ToDictionary(slot => slot, _ => factory.NextUnit(UnitDefect.None));
        foreach (var (slot, unit) in units)
        {
            rig.Load(slot, unit);
        }

        var spec = SimulatedUnitDesign.Ctp40A.ToDacTrimSpec();
        var cold = await SettleAndRead(rig, clock, 0);
        var hot = await SettleAndRead(rig, clock, 50);
        foreach (var slot in units.Keys)
        {
            var codes = SimulatedUnitTests.TrimByHand(spec, cold.Volts[slot], hot.Volts[slot], cold.ReferenceC, hot.ReferenceC);
            await rig.Instruments.UnitLinks[slot].WriteTrimAsync(codes, None);
            await rig.Instruments.UnitLinks[slot].StoreAsync(None);
        }

        var check = await SettleAndRead(rig, clock, 25);

        foreach (var slot in units.Keys)
        {
            // The slot offsets (≤ 0.02 °C = 0.2 mV) and the diode's curvature stay inside a few millivolts.
            Assert.InRange(check.Volts[slot] - spec.Target.VoltsAt(check.ReferenceC), -0.004, 0.004);
        }
    }

    private static async Task<(double ReferenceC, Dictionary<int, double> Volts)> SettleAndRead(SimulatedRig rig, VirtualTimeProvider clock, double setpointC)
    {
        await rig.Instruments.Source.SetSetpointAsync(setpointC, None);
        await Task.Delay(TimeSpan.FromMinutes(45), clock);
        var reference = await rig.Instruments.Reference.ReadRawAsync(None);
        var volts = new Dictionary<int, double>();
        foreach (var slot in rig.Fixture.Slots)
        {
            volts[slot.Slot] = await rig.Instruments.Meter.ReadDcVoltsAsync(slot.OutputChannel, None);
        }

        return (reference, volts);
    }

    private static async Task<List<double>> RecordSession(int seed)
    {
        var clock = SimulatedFixtures.Clock();
        var rig = SimulatedFixtures.Rig(seed: seed, clock: clock);
        var factory = SimulatedFixtures.Factory(seed: seed);
        for (var slot = 1; slot <= 4; slot++)
        {
            rig.Load(slot, factory.NextUnit());
        }

        var readings = new List<double>();
        foreach (var setpoint in new[] { -10.0, 40.0 })
        {
            await rig.Instruments.Source.SetSetpointAsync(setpoint, None);
            for (var i = 0; i < 20; i++)
            {
                await Task.Delay(TimeSpan.FromMinutes(2), clock);
                readings.Add(await rig.Instruments.Source.ReadTemperatureAsync(None));
                readings.Add(await rig.Instruments.Reference.ReadRawAsync(None));
                foreach (var slot in rig.Fixture.Slots)
                {
                    readings.Add(await rig.Instruments.Meter.ReadDcVoltsAsync(slot.OutputChannel, None));
                    readings.Add(await rig.Instruments.Meter.ReadDcVoltsAsync(slot.SupplyChannel, None));
                }
            }
        }

        return readings;
    }

    [Fact]
    public void FitParts_ResistorUnit_EachPartWithinToleranceAndCombinedAsConnected()
    {
        var rig = SimulatedFixtures.Rig();
        var design = SimulatedUnitDesign.Ctp40R;
        var unit = SimulatedFixtures.Factory(design: design).NextUnit(UnitDefect.None);
        rig.Load(3, unit);
        var series = LineTest.Core.Trims.ESeries.TryParse("E96", out var e96) ? e96 : throw new InvalidOperationException("E96");
        var single = new LineTest.Core.Trims.ResistorChoice
        {
            Position = "R7", IdealOhms = 9_530, Connection = LineTest.Core.Trims.ResistorConnection.Single, Parts = [9_530], Series = series,
        };
        var pair = new LineTest.Core.Trims.ResistorChoice
        {
            Position = "R8", IdealOhms = 71_400, Connection = LineTest.Core.Trims.ResistorConnection.Series, Parts = [68_100, 3_320], Series = series,
        };

        var fitted = rig.FitParts(3, [single, pair]);

        var tolerance = design.TrimPartTolerancePercent / 100;
        Assert.InRange(fitted["R7"], 9_530 * (1 - tolerance), 9_530 * (1 + tolerance));
        Assert.InRange(fitted["R8"], 71_420 * (1 - tolerance), 71_420 * (1 + tolerance));
        Assert.NotEqual(9_530, fitted["R7"]);
        Assert.Equal(fitted["R7"], unit.FittedOhms["R7"]);
        Assert.Equal(fitted["R8"], unit.FittedOhms["R8"]);
    }

    [Fact]
    public void FitParts_EmptySlotOrUnitWithoutPositions_Throws()
    {
        var rig = SimulatedFixtures.Rig();
        rig.Load(1, SimulatedFixtures.Factory().NextUnit(UnitDefect.None));

        Assert.Throws<InvalidOperationException>(() => rig.FitParts(2, []));
        Assert.Throws<InvalidOperationException>(() => rig.FitParts(1, []));
    }
}
