namespace LineTest.Rig.Simulation;

/// <summary>A simulated unit's manufacturing defect (its ground truth; the station has to find it by testing).</summary>
public enum UnitDefect
{
    /// <summary>A good unit.</summary>
    None,

    /// <summary>
    /// The diode is open: an analog unit's output rails near the supply, a digital unit's ADC reads full scale; neither
    /// follows temperature.
    /// </summary>
    OpenSensor,

    /// <summary>
    /// The trim does not take. CTP-40A: the trim DACs are stuck (writes, store and read-back look normal but the output
    /// does not change). CTP-40R: a bad joint leaves the gain position open after the trim parts are fitted (G = 1).
    /// CTP-40D: the non-volatile memory does not keep a store (read-back returns the old coefficients).
    /// </summary>
    StuckDac,

    /// <summary>The unit's link never answers; the analog output still works.</summary>
    Silent,

    /// <summary>A bad bond or contact in the sensor path: the diode's series resistance is hundreds of ohms, not tens.</summary>
    HighSeriesResistance,

    /// <summary>A leakage path across the junction (a shunt of tens of kilohms) that bypasses it at low current.</summary>
    LeakyJunction,

    /// <summary>The wrong part was fitted: its saturation current and ideality factor are far from the design's.</summary>
    WrongPart,
}
