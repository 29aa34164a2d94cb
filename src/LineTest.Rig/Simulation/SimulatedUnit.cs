using LineTest.Core.Trims;

namespace LineTest.Rig.Simulation;

/// <summary>
/// One simulated analog unit: a diode sensor at constant bias current, an inverting amplifier with a gain DAC and
/// an offset DAC, trim registers with non-volatile storage, and its ground truth (part parameters and defect) for
/// tests and campaigns that must know whether the station's verdict was right.
/// </summary>
/// <remarks>
/// The sensor follows its well with a first-order lag; its temperature is advanced exactly whenever the rig queries
/// the unit. The output uses the working registers (what the amplifier sees now); the "as shipped" helpers use the
/// stored registers, which the unit loads at power-up. A stuck DAC keeps the nominal codes whatever is written.
/// Thread safety: the rig calls a unit only under the lock of the slot holding it.
/// </remarks>
public sealed class SimulatedUnit
{
    private readonly Random _noise;
    private readonly Dictionary<string, long> _working;
    private readonly Dictionary<string, long> _stored;

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
        _working = new Dictionary<string, long>(StringComparer.Ordinal)
        {
            [design.GainRegister] = design.CodeNominal,
            [design.OffsetRegister] = design.CodeNominal,
        };
        _stored = new Dictionary<string, long>(_working, StringComparer.Ordinal);
        SensorC = SimulatedRig.DefaultAmbientC;
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
        var forward = Parameters.Diode.ForwardVolts(sensorC, Design.BiasCurrentAmps);
        var output = (gain * (Design.ReferenceVolts - forward + Parameters.InputOffsetVolts)) + offset;
        return Math.Clamp(output, Design.OutputMinVolts, Design.OutputMaxVolts);
    }

    /// <summary>Noise-free output with the working registers, volts.</summary>
    public double TrueOutputVolts(double sensorC)
        => TrueOutputVolts(sensorC, _working[Design.GainRegister], _working[Design.OffsetRegister]);

    /// <summary>Noise-free output as shipped (stored registers, which load at power-up), volts.</summary>
    public double TrueOutputVoltsAsShipped(double sensorC)
        => TrueOutputVolts(sensorC, _stored[Design.GainRegister], _stored[Design.OffsetRegister]);

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
        SensorC = block.Follow(SensorC - offset, since, now, Parameters.LagTimeConstantSeconds) + offset;
        SensorTime = now;
    }

    /// <summary>The output with its noise, volts, as a meter on the output pin sees it.</summary>
    internal double SampleOutputVolts()
    {
        var value = TrueOutputVolts(SensorC);
        return OutputNoiseVolts > 0 ? value + _noise.NextNormal(0, OutputNoiseVolts) : value;
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
        foreach (var (name, code) in _working)
        {
            _stored[name] = code;
        }
    }
}
