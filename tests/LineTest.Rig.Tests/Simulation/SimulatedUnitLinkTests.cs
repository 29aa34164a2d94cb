using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedUnitLinkTests
{
    private static readonly CancellationToken None = CancellationToken.None;

    private static (SimulatedRig Rig, SimulatedUnit Unit, IUnitLink Link) RigWith(UnitDefect defect, int slot = 2, SimulatedUnitDesign? design = null)
    {
        var rig = SimulatedFixtures.Rig();
        var unit = SimulatedFixtures.Factory(design: design).NextUnit(defect);
        rig.Load(slot, unit);
        return (rig, unit, rig.Instruments.UnitLinks[slot]);
    }

    [Fact]
    public async Task IdentifyAsync_GoodUnit_ReturnsSerialProductFirmware()
    {
        var (_, unit, link) = RigWith(UnitDefect.None);

        var identity = await link.IdentifyAsync(None);

        Assert.Equal(new UnitIdentity(unit.Serial, "CTP-40A", "1.4.2"), identity);
    }

    [Fact]
    public async Task WriteStoreReadBack_GoodUnit_ReturnsStoredCodes()
    {
        var (_, _, link) = RigWith(UnitDefect.None);

        var beforeStore = await link.ReadBackAsync(None);
        await link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 2100, ["OFFSET"] = 1990 }, None);
        var stillBefore = await link.ReadBackAsync(None);
        await link.StoreAsync(None);
        var after = await link.ReadBackAsync(None);

        Assert.Equal(2048, beforeStore["GAIN"]);
        Assert.Equal(2048, stillBefore["OFFSET"]);
        Assert.Equal(2100, after["GAIN"]);
        Assert.Equal(1990, after["OFFSET"]);
    }

    [Theory]
    [InlineData("GAIN", 4096)]
    [InlineData("OFFSET", -1)]
    [InlineData("TEMPCO", 10)]
    public async Task WriteTrimAsync_BadRegisterOrCode_InstrumentErrorAndNothingWritten(string register, long code)
    {
        var (_, unit, link) = RigWith(UnitDefect.None);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(
            () => link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 3000, [register] = code }, None));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains(register, fault.Message, StringComparison.Ordinal);
        Assert.Equal(2048, unit.WorkingRegisters["GAIN"]);
    }

    [Fact]
    public async Task AnyCommand_SilentUnit_NoAnswer()
    {
        var (_, _, link) = RigWith(UnitDefect.Silent);

        var identify = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.IdentifyAsync(None));
        var write = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.WriteTrimAsync(new Dictionary<string, long> { ["GAIN"] = 1 }, None));

        Assert.Equal(InstrumentFaultKind.NoAnswer, identify.Kind);
        Assert.Equal(InstrumentFaultKind.NoAnswer, write.Kind);
        Assert.Equal("unit slot 2", identify.Instrument);
    }

    [Fact]
    public async Task SilentUnit_AnalogOutput_StillReadsOnMeter()
    {
        var (rig, unit, _) = RigWith(UnitDefect.Silent);

        var volts = await rig.Instruments.Meter.ReadDcVoltsAsync(2, None);

        Assert.Equal(unit.TrueOutputVolts(unit.SensorC), volts, 0.0005);
    }

    [Fact]
    public async Task IdentifyAsync_EmptySlot_NoAnswer()
    {
        var rig = SimulatedFixtures.Rig();

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => rig.Instruments.UnitLinks[1].IdentifyAsync(None));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
    }

    [Fact]
    public async Task StuckDac_TrimWrittenAndStored_ReadBackLooksRightButOutputUnchanged()
    {
        var (rig, unit, link) = RigWith(UnitDefect.StuckDac);
        var spec = unit.Design.ToDacTrimSpec();
        var codes = SimulatedUnitTests.TrimByHand(spec, unit.TrueOutputVolts(0), unit.TrueOutputVolts(50), 0, 50);
        var before = unit.TrueOutputVolts(25);

        await link.WriteTrimAsync(codes, None);
        await link.StoreAsync(None);
        var readBack = await link.ReadBackAsync(None);

        Assert.Equal(codes, readBack);
        Assert.Equal(before, unit.TrueOutputVolts(25));
        Assert.NotEqual(0, unit.TrueErrorVolts(spec.Target, 25), 3);
        Assert.NotNull(rig.UnitIn(2));
    }

    [Fact]
    public async Task ReadRawAsync_GoodUnit_IsOutputInMicrovolts()
    {
        var (_, unit, link) = RigWith(UnitDefect.None);

        var counts = await link.ReadRawAsync(None);

        // Output noise 50 µV (1σ): within 300 µV of the noise-free output.
        Assert.InRange(counts, (unit.TrueOutputVolts(unit.SensorC) * 1e6) - 300, (unit.TrueOutputVolts(unit.SensorC) * 1e6) + 300);
    }

    [Fact]
    public async Task ReadTemperatureAsync_GoodUnit_IsTargetIndicationOfOutput()
    {
        var (_, unit, link) = RigWith(UnitDefect.None);

        var celsius = await link.ReadTemperatureAsync(None);

        Assert.Equal(unit.Design.Target.IndicatedC(unit.TrueOutputVolts(unit.SensorC)), celsius, 0.03);
    }

    [Fact]
    public async Task ReadRawAndTemperature_DigitalUnit_CountsAndFirmwareTemperature()
    {
        var (_, unit, link) = RigWith(UnitDefect.None, design: SimulatedUnitDesign.Ctp40D);

        var raw = await link.ReadRawAsync(None);
        var celsius = await link.ReadTemperatureAsync(None);

        // The unit sits at room temperature; ADC noise is 2 counts (1σ), the factory line is right within a few °C.
        Assert.InRange(raw, unit.TrueRawCounts(unit.SensorC) - 12, unit.TrueRawCounts(unit.SensorC) + 12);
        Assert.InRange(celsius, unit.SensorC - 5, unit.SensorC + 5);
    }

    [Fact]
    public async Task WriteStoreReadBack_DigitalUnit_ReturnsStoredCoefficients()
    {
        var (_, unit, link) = RigWith(UnitDefect.None, design: SimulatedUnitDesign.Ctp40D);
        var values = new Dictionary<string, long> { ["C0"] = 21_000_000, ["C1"] = -650_000_000 };

        await link.WriteTrimAsync(values, None);
        await link.StoreAsync(None);
        var readBack = await link.ReadBackAsync(None);

        Assert.Equal(21_000_000, readBack["C0"]);
        Assert.Equal(-650_000_000, readBack["C1"]);
        Assert.Equal(unit.StoredRegisters, readBack);
    }

    [Theory]
    [InlineData("C3", 1L)]
    [InlineData("C0", 2_147_483_648L)]
    [InlineData("GAIN", 2048L)]
    public async Task WriteTrimAsync_DigitalUnitBadRegisterOrWidth_InstrumentErrorAndNothingWritten(string register, long value)
    {
        var (_, unit, link) = RigWith(UnitDefect.None, design: SimulatedUnitDesign.Ctp40D);
        var before = unit.WorkingRegisters;

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.WriteTrimAsync(new Dictionary<string, long> { [register] = value }, None));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Equal(before, unit.WorkingRegisters);
    }

    [Fact]
    public async Task WriteTrimAsync_ResistorUnit_RejectedNamingItsPositions()
    {
        var (_, _, link) = RigWith(UnitDefect.None, design: SimulatedUnitDesign.Ctp40R);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => link.WriteTrimAsync(new Dictionary<string, long> { ["R7"] = 10_000_000 }, None));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("R7 and R8", fault.Message, StringComparison.Ordinal);
    }
}
