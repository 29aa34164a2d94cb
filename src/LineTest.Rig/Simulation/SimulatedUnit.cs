using LineTest.Core.Trims;

namespace LineTest.Rig.Simulation;

/// <summary>
/// One simulated unit: a diode sensor at constant bias current followed by the output stage of its design
/// (<see cref="SimulatedUnitKind"/>): an inverting amplifier with a gain DAC and an offset DAC (CTP-40A), a
/// pre-amplifier and a select-on-test resistor network (CTP-40R), or an ADC and firmware coefficients (CTP-40D);
/// trim registers with non-volatile storage, and its ground truth (part parameters and defect) for tests and
/// campaigns that must know whether the station's verdict was right.
/// </summary>
/// <remarks>
/// The sensor follows its well with a first-order lag; its temperature is advanced exactly whenever the rig queries
/// the unit. The output uses the working registers (what the amplifier sees now); the "as shipped" helpers use the
/// stored registers, which the unit loads at power-up. A stuck DAC keeps the nominal codes whatever is written.
/// Thread safety: the rig calls a unit only under the lock of the slot holding it.
/// </remarks>
public sealed class SimulatedUnit
{
    private const int MaxTipSteps = 2000;

    private readonly Random _noise;
    private readonly Dictionary<string, long> _working;
    private readonly Dictionary<string, long> _stored;
    private readonly Dictionary<string, double?> _fittedOhms;

    // The probe body's temperature, °C: the die (SensorC) follows it through the tip lag.
    private double _bodyC;

    internal SimulatedUnit(
        string serial,
        SimulatedUnitDesign design,
        SimulatedUnitParameters parameters,
        UnitDefect defect,
        double outputNoiseVolts,
        int noiseSeed)
    {
        Serial = serial;
        Design = design;
        Parameters = parameters;
        Defect = defect;
        OutputNoiseVolts = outputNoiseVolts;
        _noise = new Random(noiseSeed);
        _working = design.Kind switch
        {
            SimulatedUnitKind.FirmwareTrimmed => new Dictionary<string, long>(design.FactoryCoefficientRegisters(), StringComparer.Ordinal),
            SimulatedUnitKind.ResistorTrimmed => new Dictionary<string, long>(StringComparer.Ordinal),
            _ => new Dictionary<string, long>(StringComparer.Ordinal)
            {
                [design.GainRegister] = design.CodeNominal,
                [design.OffsetRegister] = design.CodeNominal,
            },
        };
        _stored = new Dictionary<string, long>(_working, StringComparer.Ordinal);

        // A resistor-trimmed unit is calibrated with precision parts of exactly the design's calibration values.
        _fittedOhms = new Dictionary<string, double?>(StringComparer.Ordinal);
        if (design.Kind == SimulatedUnitKind.ResistorTrimmed)
        {
            _fittedOhms[design.GainPosition] = design.GainFittedOhms;
            _fittedOhms[design.OffsetPosition] = design.OffsetFittedOhms;
        }

        SensorC = SimulatedRig.DefaultAmbientC;
        _bodyC = SensorC;
    }

    /// <summary>The unit's serial.</summary>
    public string Serial { get; }

    /// <summary>The design the unit was built to.</summary>
    public SimulatedUnitDesign Design { get; }

    /// <summary>This part's actual component values (ground truth).</summary>
    public SimulatedUnitParameters Parameters { get; }

    /// <summary>This part's defect (ground truth).</summary>
    public UnitDefect Defect { get; }

    /// <summary>Standard deviation of the output noise, volts.</summary>
    public double OutputNoiseVolts { get; }

    /// <summary>The sensor's temperature when the unit was last queried or placed, °C.</summary>
    public double SensorC { get; private set; }

    /// <summary>When <see cref="SensorC"/> was last brought up to date (null until the unit is placed in a slot).</summary>
    public DateTimeOffset? SensorTime { get; private set; }

    /// <summary>The working trim registers.</summary>
    public IReadOnlyDictionary<string, long> WorkingRegisters => new Dictionary<string, long>(_working, StringComparer.Ordinal);

    /// <summary>The trim registers in non-volatile memory.</summary>
    public IReadOnlyDictionary<string, long> StoredRegisters => new Dictionary<string, long>(_stored, StringComparer.Ordinal);

    /// <summary>
    /// Noise-free output, volts, with the sensor at <paramref name="sensorC"/> and the given codes
    /// (a stuck DAC ignores the codes; an open sensor rails high).
    /// </summary>
    public double TrueOutputVolts(double sensorC, long gainCode, long offsetCode)
    {
        if (Defect == UnitDefect.OpenSensor)
        {
            return Parameters.OpenRailVolts;
        }

        if (Defect == UnitDefect.StuckDac)
        {
            gainCode = Design.CodeNominal;
            offsetCode = Design.CodeNominal;
        }

        var gain = Parameters.DesignGain * (1 + (Parameters.GainStepPerCode * (gainCode - Design.CodeNominal)));
        var offset = Parameters.OffsetStepVolts * (offsetCode - Design.CodeNominal);
        var forward = SensedVolts(sensorC);
        var output = (gain * (Design.ReferenceVolts - forward + Parameters.InputOffsetVolts)) + offset;
        return Math.Clamp(output, Design.OutputMinVolts, Design.OutputMaxVolts);
    }

    /// <summary>
    /// Noise-free output with the working registers (or the parts now fitted), volts. A digital unit has no analog
    /// output: its output pin reads 0 V.
    /// </summary>
    public double TrueOutputVolts(double sensorC) => Design.Kind switch
    {
        SimulatedUnitKind.ResistorTrimmed => ResistorOutputVolts(sensorC),
        SimulatedUnitKind.FirmwareTrimmed => 0.0,
        _ => TrueOutputVolts(sensorC, _working[Design.GainRegister], _working[Design.OffsetRegister]),
    };

    /// <summary>Noise-free output as shipped (stored registers, which load at power-up, or the fitted parts), volts.</summary>
    public double TrueOutputVoltsAsShipped(double sensorC) => Design.Kind switch
    {
        SimulatedUnitKind.ResistorTrimmed => ResistorOutputVolts(sensorC),
        SimulatedUnitKind.FirmwareTrimmed => 0.0,
        _ => TrueOutputVolts(sensorC, _stored[Design.GainRegister], _stored[Design.OffsetRegister]),
    };

    /// <summary>
    /// The actual resistance now at each select-on-test position of a resistor-trimmed unit, ohms (null: open);
    /// empty for other designs.
    /// </summary>
    public IReadOnlyDictionary<string, double?> FittedOhms => new Dictionary<string, double?>(_fittedOhms, StringComparer.Ordinal);

    /// <summary>
    /// Noise-free raw ADC reading of a digital unit with the sensor at <paramref name="sensorC"/>, counts (not rounded);
    /// an open sensor reads full scale. For an analog unit: its output in microvolts.
    /// </summary>
    public double TrueRawCounts(double sensorC)
    {
        if (Design.Kind != SimulatedUnitKind.FirmwareTrimmed)
        {
            return TrueOutputVolts(sensorC) * 1e6;
        }

        if (Defect == UnitDefect.OpenSensor)
        {
            return Design.AdcFullScaleCounts;
        }

        var counts = SensedVolts(sensorC) / Parameters.AdcReferenceVolts * (1L << Design.AdcBits);
        return Math.Clamp(counts, 0, Design.AdcFullScaleCounts);
    }

    /// <summary>
    /// The temperature a digital unit's firmware reports for raw reading <paramref name="raw"/> with the given
    /// registers (c0 + c1·r + c2·r², missing registers count as 0), °C.
    /// </summary>
    public double ReportedC(double raw, IReadOnlyDictionary<string, long> registers)
    {
        ArgumentNullException.ThrowIfNull(registers);
        var coefficients = Design.CoefficientRegisters
            .Select(r => registers.TryGetValue(r.Register, out var q) ? r.Dequantise(q) : 0.0)
            .ToArray();
        return Core.Trims.FirmwareTrim.Evaluate(coefficients, raw);
    }

    /// <summary>
    /// Temperature error of a digital unit as shipped, °C: what its firmware reports from its stored coefficients with
    /// the sensor settled at <paramref name="celsius"/> (noise-free), minus <paramref name="celsius"/>.
    /// </summary>
    public double TrueReportedErrorC(double celsius) => ReportedC(TrueRawCounts(celsius), _stored) - celsius;

    /// <summary>Output error as shipped against <paramref name="target"/>, volts, with the sensor settled at <paramref name="celsius"/>.</summary>
    public double TrueErrorVolts(LinearTransfer target, double celsius)
    {
        ArgumentNullException.ThrowIfNull(target);
        return TrueOutputVoltsAsShipped(celsius) - target.VoltsAt(celsius);
    }

    /// <summary>
    /// Temperature error as shipped, °C: the temperature <paramref name="target"/> indicates for the unit's output
    /// minus the true temperature <paramref name="celsius"/>.
    /// </summary>
    public double TrueErrorC(LinearTransfer target, double celsius)
    {
        ArgumentNullException.ThrowIfNull(target);
        return target.IndicatedC(TrueOutputVoltsAsShipped(celsius)) - celsius;
    }

    /// <summary>
    /// Noise-free output of an analog unit as it is while being calibrated, volts: nominal DAC codes (CTP-40A) or the
    /// design's precision calibration parts (CTP-40R), with the sensor settled at <paramref name="sensorC"/>. Ground truth
    /// of the curve a gain-and-offset trim maps onto its target; 0 V for a digital unit.
    /// </summary>
    public double CalibrationOutputVolts(double sensorC) => Design.Kind switch
    {
        SimulatedUnitKind.ResistorTrimmed => ResistorOutputVolts(sensorC, Design.GainFittedOhms, Design.OffsetFittedOhms),
        SimulatedUnitKind.FirmwareTrimmed => 0.0,
        _ => TrueOutputVolts(sensorC, Design.CodeNominal, Design.CodeNominal),
    };

    /// <summary>Output of a resistor-trimmed unit with the parts now fitted.</summary>
    private double ResistorOutputVolts(double sensorC) =>
        ResistorOutputVolts(sensorC, _fittedOhms[Design.GainPosition], _fittedOhms[Design.OffsetPosition]);

    /// <summary>
    /// Output of a resistor-trimmed unit: <c>V = (1 + Rf/Rg)·u(T) + Vref·Rfo/Ro</c> with the given parts
    /// (an open position gives G = 1 or no offset) and <c>u(T) = A·(V_b − V_f(T) + e_in)</c>, clipped to the swing.
    /// </summary>
    private double ResistorOutputVolts(double sensorC, double? rg, double? ro)
    {
        if (Defect == UnitDefect.OpenSensor)
        {
            return Parameters.OpenRailVolts;
        }

        var gain = rg is { } g ? 1.0 + (Design.GainFeedbackOhms / g) : 1.0;
        var offset = ro is { } o ? Design.OffsetNetworkReferenceVolts * Design.OffsetFeedbackOhms / o : 0.0;
        var forward = SensedVolts(sensorC);
        var u = Parameters.DesignGain * (Design.ReferenceVolts - forward + Parameters.InputOffsetVolts);
        return Math.Clamp((gain * u) + offset, Design.OutputMinVolts, Design.OutputMaxVolts);
    }

    /// <summary>
    /// The diode voltage as the stage after it sees it, volts: V_f at the bias current plus the stage's small quadratic
    /// non-linearity β·(V_f − v_c)².
    /// </summary>
    public double SensedVolts(double sensorC)
    {
        var forward = Parameters.Diode.ForwardVolts(sensorC, Design.BiasCurrentAmps);
        var d = forward - Design.NonLinearityCentreVolts;
        return forward + (Parameters.NonLinearityPerVolt * d * d);
    }

    /// <summary>
    /// The unit's true error as shipped at each of <paramref name="temperaturesC"/> (sensor settled there, noise-free), °C:
    /// what a digital unit reports minus the temperature, or for an analog unit the temperature <paramref name="target"/>
    /// indicates for its output minus the temperature. Ground truth for campaigns and benchmarks.
    /// </summary>
    public double[] TrueErrorsC(IReadOnlyList<double> temperaturesC, LinearTransfer? target)
    {
        ArgumentNullException.ThrowIfNull(temperaturesC);
        if (Design.Kind != SimulatedUnitKind.FirmwareTrimmed && target is null)
        {
            throw new ArgumentNullException(nameof(target), "An analog unit's error needs the target transfer function.");
        }

        return temperaturesC.Select(t => Design.Kind == SimulatedUnitKind.FirmwareTrimmed ? TrueReportedErrorC(t) : TrueErrorC(target!, t)).ToArray();
    }

    /// <summary>Whether the unit as shipped is within ±<paramref name="limitC"/> of the target at every one of <paramref name="temperaturesC"/>.</summary>
    public bool IsTrulyWithin(LinearTransfer target, double limitC, IEnumerable<double> temperaturesC)
    {
        ArgumentNullException.ThrowIfNull(temperaturesC);
        ArgumentOutOfRangeException.ThrowIfNegative(limitC);
        return temperaturesC.All(t => Math.Abs(TrueErrorC(target, t)) <= limitC);
    }

    /// <summary>Puts the sensor at <paramref name="sensorC"/> at <paramref name="time"/> (the unit arrives from the bench).</summary>
    internal void PlaceAt(double sensorC, DateTimeOffset time)
    {
        SensorC = sensorC;
        _bodyC = sensorC;
        SensorTime = time;
    }

    /// <summary>Advances the sensor exactly along the slot well's course up to <paramref name="now"/>.</summary>
    internal void FollowWell(SimulatedDryBlock block, int slot, DateTimeOffset now)
    {
        if (SensorTime is not { } since || now <= since)
        {
            return;
        }

        // The well is the reference well plus a static offset, so follow the reference well and add the offset back.
        var offset = block.SlotOffsetC(slot);
        if (Parameters.TipLagTimeConstantSeconds <= 0)
        {
            _bodyC = block.Follow(_bodyC - offset, since, now, Parameters.LagTimeConstantSeconds) + offset;
            SensorC = _bodyC;
            SensorTime = now;
            return;
        }

        // The die follows the body through its own lag: exact for a body that moves linearly over a step, so the span is
        // cut into steps of at most a second (the body's course is exact at each step's end) — at most MaxTipSteps of
        // them, coarser only over gaps of more than half an hour.
        var total = (now - since).TotalSeconds;
        var steps = (int)Math.Clamp(Math.Ceiling(total), 1, MaxTipSteps);
        var from = since;
        for (var k = 1; k <= steps; k++)
        {
            var to = k == steps ? now : since + TimeSpan.FromSeconds(total * k / steps);
            var seconds = (to - from).TotalSeconds;
            var bodyBefore = _bodyC;
            _bodyC = block.Follow(_bodyC - offset, from, to, Parameters.LagTimeConstantSeconds) + offset;
            SensorC = FirstOrderLag.FollowLinear(SensorC, bodyBefore, (_bodyC - bodyBefore) / seconds, seconds, Parameters.TipLagTimeConstantSeconds);
            from = to;
        }

        SensorTime = now;
    }

    /// <summary>The output with its noise, volts, as a meter on the output pin sees it.</summary>
    internal double SampleOutputVolts()
    {
        var value = TrueOutputVolts(SensorC);
        return OutputNoiseVolts > 0 ? value + _noise.NextNormal(0, OutputNoiseVolts) : value;
    }

    /// <summary>The raw reading with its noise, as the unit's link reports it: ADC counts (digital) or output microvolts (analog).</summary>
    internal long SampleRawCounts()
    {
        if (Design.Kind != SimulatedUnitKind.FirmwareTrimmed)
        {
            return (long)Math.Round(SampleOutputVolts() * 1e6);
        }

        var counts = TrueRawCounts(SensorC);
        if (Defect != UnitDefect.OpenSensor && Design.AdcNoiseCounts > 0)
        {
            counts += _noise.NextNormal(0, Design.AdcNoiseCounts);
        }

        return (long)Math.Clamp(Math.Round(counts), 0, Design.AdcFullScaleCounts);
    }

    /// <summary>The temperature the unit reports over its link: firmware coefficients on a noisy raw reading (digital).</summary>
    internal double SampleReportedC() => ReportedC(SampleRawCounts(), _working);

    /// <summary>
    /// Fits a part of actual value <paramref name="actualOhms"/> at <paramref name="position"/> (the operator's hands).
    /// A unit with the trim-does-not-take defect has a bad joint at its gain position: it stays open.
    /// </summary>
    internal void Fit(string position, double actualOhms)
    {
        if (!_fittedOhms.ContainsKey(position))
        {
            throw new InvalidOperationException(
                $"Unit {Serial} has no select-on-test position {position} (it has {string.Join(", ", _fittedOhms.Keys)}).");
        }

        _fittedOhms[position] = Defect == UnitDefect.StuckDac && position == Design.GainPosition ? null : actualOhms;
    }

    internal void WriteWorking(IReadOnlyDictionary<string, long> values)
    {
        foreach (var (name, code) in values)
        {
            _working[name] = code;
        }
    }

    internal void Store()
    {
        // A digital unit whose non-volatile memory fails acknowledges the store but keeps what it had.
        if (Defect == UnitDefect.StuckDac && Design.Kind == SimulatedUnitKind.FirmwareTrimmed)
        {
            return;
        }

        foreach (var (name, code) in _working)
        {
            _stored[name] = code;
        }
    }
}
