namespace LineTest.Rig.Simulation;

/// <summary>A simulated unit's manufacturing defect (its ground truth; the station has to find it by testing).</summary>
public enum UnitDefect
{
    /// <summary>A good unit.</summary>
    None,

    /// <summary>The diode is open: the amplifier output rails near the supply and does not follow temperature.</summary>
    OpenSensor,

    /// <summary>The trim DACs are stuck: writes, store and read-back look normal but the output does not change.</summary>
    StuckDac,

    /// <summary>The unit's link never answers; the analog output still works.</summary>
    Silent,
}
