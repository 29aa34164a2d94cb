using LineTest.Core.Decisions;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;

namespace LineTest.Core.Definitions;

/// <summary>
/// The one table of bounds for every number and name in sequence and fixture files that the runtime relies on:
/// counts, sample sizes, sweep points, times, noise, temperatures, currents and register names. <c>check</c> judges
/// with it (<see cref="SequenceChecker"/>, <see cref="FixtureChecker"/>), the JSON Schema writes it out
/// (<see cref="DefinitionSchemas"/>), and the simulator and runtime may take any admitted value without a check of
/// their own. The limits are wide enough for any real station and narrow enough that one batch stays finite in time
/// and memory: a sample count of 10^8 or a time constant of 10^308 is a typing mistake, never a setting.
/// </summary>
public static class DefinitionBounds
{
    /// <summary>A temperature a source, setpoint or standby may have, °C (liquid nitrogen to a hot furnace).</summary>
    public static readonly NumberBound TemperatureC = new(-200, 1000, "°C");

    /// <summary>A temperature difference or band, °C.</summary>
    public static readonly NumberBound TemperatureBandC = NumberBound.Positive(100, "°C");

    /// <summary>A drift rate, °C per minute.</summary>
    public static readonly NumberBound DriftCPerMinute = NumberBound.Positive(100, "°C/min");

    /// <summary>A ramp rate of the source, °C per minute.</summary>
    public static readonly NumberBound RampCPerMinute = NumberBound.Positive(1000, "°C/min");

    /// <summary>A time constant (source settling, unit lag), seconds: at most one hour.</summary>
    public static readonly NumberBound TimeConstantSeconds = NumberBound.Positive(3600, "s");

    /// <summary>A stability or soak window, seconds.</summary>
    public static readonly NumberBound WindowSeconds = NumberBound.Positive(3600, "s");

    /// <summary>The interval between readings of a stability or soak window, seconds (at least 0.1 s).</summary>
    public static readonly NumberBound SampleIntervalSeconds = new(0.1, 600, "s");

    /// <summary>A timeout of a settle or soak, seconds: at most eight hours.</summary>
    public static readonly NumberBound TimeoutSeconds = NumberBound.Positive(8 * 3600, "s");

    /// <summary>A minimum soak time, seconds.</summary>
    public static readonly NumberBound MinimumSoakSeconds = NumberBound.NonNegative(8 * 3600, "s");

    /// <summary>Readings averaged in one measurement (measure, verify, supply-current, iv-sweep).</summary>
    public static readonly NumberBound Samples = NumberBound.Count(1, 1000);

    /// <summary>Old/new code pairs read by a DAC trim's check (each pair: two writes and two meter readings per unit).</summary>
    public static readonly NumberBound DacCheckPairs = NumberBound.Count(1, 20);

    /// <summary>Currents of one I–V sweep: enough for the three-parameter fit, few enough for the cycle time.</summary>
    public static readonly NumberBound SweepPoints = NumberBound.Count(Characterisation.ShockleyFit.MinimumPoints, Sequences.Steps.IvSweepStepKind.MaxPoints);

    /// <summary>A sweep or bias current through a sensor, amperes.</summary>
    public static readonly NumberBound SensorCurrentAmps = NumberBound.Positive(1, "A");

    /// <summary>A voltage compliance, volts.</summary>
    public static readonly NumberBound ComplianceVolts = NumberBound.Positive(100, "V");

    /// <summary>A simulated noise (1σ), volts.</summary>
    public static readonly NumberBound NoiseVolts = NumberBound.NonNegative(1, "V");

    /// <summary>The simulated block's temperature noise (1σ), °C.</summary>
    public static readonly NumberBound BlockNoiseC = NumberBound.NonNegative(1, "°C");

    /// <summary>A static offset of one slot's well from the reference well (simulated, or found by the fixture's calibration), °C.</summary>
    public static readonly NumberBound SlotOffsetC = new(-10, 10, "°C");

    /// <summary>A source's well-to-well uniformity (half-width), °C: zero up to 10 °C.</summary>
    public static readonly NumberBound WellUniformityC = NumberBound.NonNegative(10, "°C");

    /// <summary>A share of units (defect rates), 0 … 1.</summary>
    public static readonly NumberBound Share = NumberBound.NonNegative(1, string.Empty);

    /// <summary>The spread (1σ) of the unit lag between parts, as a fraction.</summary>
    public static readonly NumberBound LagSpread = NumberBound.NonNegative(0.5, string.Empty);

    /// <summary>A simulated sensor's own response time, seconds; 0 for none.</summary>
    public static readonly NumberBound SensorLagSeconds = NumberBound.NonNegative(600, "s");

    /// <summary>Setpoints of one sequence.</summary>
    public static readonly NumberBound SetpointCount = NumberBound.Count(1, 50);

    /// <summary>Steps of one sequence.</summary>
    public static readonly NumberBound StepCount = NumberBound.Count(1, 500);

    /// <summary>Slots of one fixture.</summary>
    public static readonly NumberBound SlotCount = NumberBound.Count(1, 64);

    /// <summary>A slot number as printed on the fixture.</summary>
    public static readonly NumberBound SlotNumber = NumberBound.Count(1, 64);

    /// <summary>A meter or SMU channel number.</summary>
    public static readonly NumberBound Channel = NumberBound.Count(1, 999);

    /// <summary>A sequence revision.</summary>
    public static readonly NumberBound Revision = NumberBound.Count(1, 1_000_000);

    /// <summary>A serial baud rate.</summary>
    public static readonly NumberBound Baud = NumberBound.Count(50, 4_000_000, "Bd");

    /// <summary>A reply timeout, milliseconds (one minute at most).</summary>
    public static readonly NumberBound PortTimeoutMs = NumberBound.Count(1, 60_000, "ms");

    /// <summary>Retries of an idempotent query.</summary>
    public static readonly NumberBound Retries = NumberBound.Count(0, 10);

    /// <summary>A meter range, volts.</summary>
    public static readonly NumberBound MeterRangeVolts = NumberBound.Positive(1000, "V");

    /// <summary>A resolution or offset of a meter, volts.</summary>
    public static readonly NumberBound MeterVolts = NumberBound.NonNegative(1, "V");

    /// <summary>A meter's display resolution, volts.</summary>
    public static readonly NumberBound ResolutionVolts = NumberBound.Positive(1, "V");

    /// <summary>A meter's accuracy, percent of reading.</summary>
    public static readonly NumberBound AccuracyPercent = NumberBound.NonNegative(10, "%");

    /// <summary>A meter's integration time, power-line cycles.</summary>
    public static readonly NumberBound IntegrationPlc = new(0.001, 100, "PLC");

    /// <summary>A certificate's expanded uncertainty, °C.</summary>
    public static readonly NumberBound CertificateUncertaintyC = NumberBound.NonNegative(10, "°C");

    /// <summary>A coverage factor.</summary>
    public static readonly NumberBound CoverageFactor = NumberBound.Positive(10, string.Empty);

    /// <summary>A readout resolution in its raw unit (Ω, mV or °C).</summary>
    public static readonly NumberBound ReadoutResolution = NumberBound.Positive(100, string.Empty);

    /// <summary>A resistance of a shunt, fitted part or trim network, ohms.</summary>
    public static readonly NumberBound Ohms = NumberBound.Positive(1e9, "Ω");

    /// <summary>A limit value, in the unit of its limits.</summary>
    public static readonly NumberBound LimitValue = new(-1e12, 1e12, string.Empty);

    /// <summary>A guard-band factor on the expanded uncertainty.</summary>
    public static readonly NumberBound GuardBandFactor = NumberBound.NonNegative(10, string.Empty);

    /// <summary>A unit's output sensitivity (volts or counts per °C), by magnitude; it must not be zero.</summary>
    public static readonly NumberBound SensitivityMagnitude = NumberBound.Positive(1e6, string.Empty);

    /// <summary>A target transfer function's offset, volts.</summary>
    public static readonly NumberBound TransferOffsetVolts = new(-1000, 1000, "V");

    /// <summary>A DAC code (a signed 32-bit register).</summary>
    public static readonly NumberBound DacCode = NumberBound.Count(int.MinValue, int.MaxValue);

    /// <summary>A resistor trim's part tolerance, percent.</summary>
    public static readonly NumberBound TolerancePercent = new(0, 50, "%");

    /// <summary>A reference voltage of a resistor offset network, by magnitude, volts.</summary>
    public static readonly NumberBound ReferenceVoltsMagnitude = NumberBound.Positive(100, "V");

    /// <summary>Bits of a firmware coefficient register, sign included.</summary>
    public static readonly NumberBound RegisterBits = NumberBound.Count(2, FirmwareCoefficientSpec.MaxBits);

    /// <summary>Fractional bits of a firmware Q format.</summary>
    public static readonly NumberBound FractionalBits = NumberBound.Count(-200, 200);

    /// <summary>
    /// A trim register name as the unit link carries it (<c>TRIM NAME=value,…</c>): an upper-case letter, then
    /// upper-case letters, digits or underscores, at most 16 characters so a read-back of three registers fits a
    /// 256-character reply line.
    /// </summary>
    public static readonly TextBound RegisterName = new(
        "^[A-Z][A-Z0-9_]*$", 16, "a register name the unit link can carry (an upper-case letter, then A–Z, 0–9 or _)", "GAIN");

    /// <summary>A serial port name: printable, no spaces at the ends.</summary>
    public static readonly TextBound PortName = new(
        @"^[^\s\x00-\x1f]([^\x00-\x1f]*[^\s\x00-\x1f])?$", 200, "a port name without control characters", "/dev/ttyUSB0");

    /// <summary>The bound of a model property, by its declaring type and C# name; null when the property has none.</summary>
    public static object? ForProperty(Type declaringType, string propertyName) =>
        ByProperty.TryGetValue((declaringType, propertyName), out var bound) ? bound : null;

    /// <summary>A trim step's calibration points: two setpoints or more, each once (a gain-and-offset trim takes at most three).</summary>
    public static readonly ListBound TrimPoints = new(2, Unique: true);

    private static readonly Dictionary<(Type, string), object> ByProperty = new()
    {
        [(typeof(TrimStep), nameof(TrimStep.Points))] = TrimPoints,
        [(typeof(SourceDefinition), nameof(SourceDefinition.SafeMinC))] = TemperatureC,
        [(typeof(SourceDefinition), nameof(SourceDefinition.SafeMaxC))] = TemperatureC,
        [(typeof(SourceDefinition), nameof(SourceDefinition.StandbyC))] = TemperatureC,
        [(typeof(SourceDefinition), nameof(SourceDefinition.RampUpCPerMinute))] = RampCPerMinute,
        [(typeof(SourceDefinition), nameof(SourceDefinition.RampDownCPerMinute))] = RampCPerMinute,
        [(typeof(SourceDefinition), nameof(SourceDefinition.SettlingTimeConstantSeconds))] = TimeConstantSeconds,
        [(typeof(SourceDefinition), nameof(SourceDefinition.WellUniformityC))] = WellUniformityC,
        [(typeof(MeterDefinition), nameof(MeterDefinition.RangeVolts))] = MeterRangeVolts,
        [(typeof(MeterDefinition), nameof(MeterDefinition.AccuracyPercentOfReading))] = AccuracyPercent,
        [(typeof(MeterDefinition), nameof(MeterDefinition.AccuracyOffsetVolts))] = MeterVolts,
        [(typeof(MeterDefinition), nameof(MeterDefinition.ResolutionVolts))] = ResolutionVolts,
        [(typeof(MeterDefinition), nameof(MeterDefinition.IntegrationPlc))] = IntegrationPlc,
        [(typeof(ReferenceDefinition), nameof(ReferenceDefinition.CertificateExpandedUncertaintyC))] = CertificateUncertaintyC,
        [(typeof(ReferenceDefinition), nameof(ReferenceDefinition.CertificateCoverageFactor))] = CoverageFactor,
        [(typeof(ReferenceDefinition), nameof(ReferenceDefinition.ReadoutResolution))] = ReadoutResolution,
        [(typeof(SlotDefinition), nameof(SlotDefinition.Slot))] = SlotNumber,
        [(typeof(SlotDefinition), nameof(SlotDefinition.OutputChannel))] = Channel,
        [(typeof(SlotDefinition), nameof(SlotDefinition.SupplyChannel))] = Channel,
        [(typeof(SlotDefinition), nameof(SlotDefinition.SmuChannel))] = Channel,
        [(typeof(SlotDefinition), nameof(SlotDefinition.SupplyShuntOhms))] = Ohms,
        [(typeof(SlotDefinition), nameof(SlotDefinition.WellOffsetC))] = SlotOffsetC,
        [(typeof(SourceMeterDefinition), nameof(SourceMeterDefinition.ComplianceVolts))] = ComplianceVolts,
        [(typeof(SourceMeterDefinition), nameof(SourceMeterDefinition.MaxCurrentAmps))] = SensorCurrentAmps,
        [(typeof(SourceMeterDefinition), nameof(SourceMeterDefinition.NoiseVolts))] = NoiseVolts,
        [(typeof(PortDefinition), nameof(PortDefinition.Name))] = PortName,
        [(typeof(PortDefinition), nameof(PortDefinition.Baud))] = Baud,
        [(typeof(PortDefinition), nameof(PortDefinition.TimeoutMs))] = PortTimeoutMs,
        [(typeof(PortDefinition), nameof(PortDefinition.Retries))] = Retries,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.UnitLagTimeConstantSeconds))] = TimeConstantSeconds,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.UnitLagSpread))] = LagSpread,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.BlockNoiseC))] = BlockNoiseC,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.UnitOutputNoiseVolts))] = NoiseVolts,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.SlotOffsetsC))] = SlotOffsetC,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.DefectRate))] = Share,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.SensorDefectRate))] = Share,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.ReferenceLagTimeConstantSeconds))] = SensorLagSeconds,
        [(typeof(SimulationDefinition), nameof(SimulationDefinition.UnitTipLagFraction))] = Share,
        [(typeof(SequenceDefinition), nameof(SequenceDefinition.Revision))] = Revision,
        [(typeof(SequenceDefinition), nameof(SequenceDefinition.NominalBiasAmps))] = SensorCurrentAmps,
        [(typeof(StabilitySettings), nameof(StabilitySettings.BandC))] = TemperatureBandC,
        [(typeof(StabilitySettings), nameof(StabilitySettings.MaxDriftCPerMinute))] = DriftCPerMinute,
        [(typeof(StabilitySettings), nameof(StabilitySettings.WindowSeconds))] = WindowSeconds,
        [(typeof(StabilitySettings), nameof(StabilitySettings.SampleIntervalSeconds))] = SampleIntervalSeconds,
        [(typeof(StabilitySettings), nameof(StabilitySettings.MaxOffsetFromSetpointC))] = TemperatureBandC,
        [(typeof(StabilitySettings), nameof(StabilitySettings.TimeoutSeconds))] = TimeoutSeconds,
        [(typeof(SoakSettings), nameof(SoakSettings.MinimumSeconds))] = MinimumSoakSeconds,
        [(typeof(SoakSettings), nameof(SoakSettings.MaxDriftCPerMinute))] = DriftCPerMinute,
        [(typeof(SoakSettings), nameof(SoakSettings.WindowSeconds))] = WindowSeconds,
        [(typeof(SoakSettings), nameof(SoakSettings.SampleIntervalSeconds))] = SampleIntervalSeconds,
        [(typeof(SoakSettings), nameof(SoakSettings.TimeoutSeconds))] = TimeoutSeconds,
        [(typeof(SetpointDefinition), nameof(SetpointDefinition.Celsius))] = TemperatureC,
        [(typeof(SettleSettings), nameof(SettleSettings.MaxExtrapolationUncertaintyC))] = TemperatureBandC,
        [(typeof(MeasureStep), nameof(MeasureStep.Samples))] = Samples,
        [(typeof(VerifyStep), nameof(VerifyStep.Samples))] = Samples,
        [(typeof(SupplyCurrentStep), nameof(SupplyCurrentStep.Samples))] = Samples,
        [(typeof(IvSweepStep), nameof(IvSweepStep.Samples))] = Samples,
        [(typeof(IvSweepStep), nameof(IvSweepStep.Points))] = SweepPoints,
        [(typeof(IvSweepStep), nameof(IvSweepStep.CurrentsAmps))] = SensorCurrentAmps,
        [(typeof(IvSweepStep), nameof(IvSweepStep.FromAmps))] = SensorCurrentAmps,
        [(typeof(IvSweepStep), nameof(IvSweepStep.ToAmps))] = SensorCurrentAmps,
        [(typeof(IvSweepStep), nameof(IvSweepStep.ComplianceVolts))] = ComplianceVolts,
        [(typeof(IvSweepStep), nameof(IvSweepStep.NominalBiasAmps))] = SensorCurrentAmps,
        [(typeof(LimitSpec), nameof(LimitSpec.Low))] = LimitValue,
        [(typeof(LimitSpec), nameof(LimitSpec.High))] = LimitValue,
        [(typeof(LimitSpec), nameof(LimitSpec.GuardBandFactor))] = GuardBandFactor,
        [(typeof(DacTrimSpec), nameof(DacTrimSpec.CheckPairs))] = DacCheckPairs,
        [(typeof(DacChannelSpec), nameof(DacChannelSpec.Min))] = DacCode,
        [(typeof(DacChannelSpec), nameof(DacChannelSpec.Max))] = DacCode,
        [(typeof(DacChannelSpec), nameof(DacChannelSpec.Nominal))] = DacCode,
        [(typeof(DacChannelSpec), nameof(DacChannelSpec.Register))] = RegisterName,
        [(typeof(LinearTransfer), nameof(LinearTransfer.OffsetVolts))] = TransferOffsetVolts,
        [(typeof(ResistorTrimSpec), nameof(ResistorTrimSpec.TolerancePercent))] = TolerancePercent,
        [(typeof(ResistorGainNetwork), nameof(ResistorGainNetwork.FeedbackOhms))] = Ohms,
        [(typeof(ResistorGainNetwork), nameof(ResistorGainNetwork.FittedOhms))] = Ohms,
        [(typeof(ResistorGainNetwork), nameof(ResistorGainNetwork.MinOhms))] = Ohms,
        [(typeof(ResistorGainNetwork), nameof(ResistorGainNetwork.MaxOhms))] = Ohms,
        [(typeof(ResistorOffsetNetwork), nameof(ResistorOffsetNetwork.FeedbackOhms))] = Ohms,
        [(typeof(ResistorOffsetNetwork), nameof(ResistorOffsetNetwork.FittedOhms))] = Ohms,
        [(typeof(ResistorOffsetNetwork), nameof(ResistorOffsetNetwork.MinOhms))] = Ohms,
        [(typeof(ResistorOffsetNetwork), nameof(ResistorOffsetNetwork.MaxOhms))] = Ohms,
        [(typeof(FirmwareCoefficientSpec), nameof(FirmwareCoefficientSpec.Register))] = RegisterName,
        [(typeof(FirmwareCoefficientSpec), nameof(FirmwareCoefficientSpec.Bits))] = RegisterBits,
        [(typeof(FirmwareCoefficientSpec), nameof(FirmwareCoefficientSpec.FractionalBits))] = FractionalBits,
    };
}
