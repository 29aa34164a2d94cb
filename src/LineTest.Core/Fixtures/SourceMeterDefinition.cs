namespace LineTest.Core.Fixtures;

/// <summary>
/// The source-measure unit (SMU) that forces a current through each slot's sensor and measures the voltage across it
/// (for I–V sweeps); each slot names its channel with <see cref="SlotDefinition.SmuChannel"/>.
/// </summary>
public sealed record SourceMeterDefinition
{
    /// <summary>Voltage compliance used when a step gives none, volts.</summary>
    public double ComplianceVolts { get; init; } = 2.5;

    /// <summary>Largest current the fixture's wiring and the sensors allow, amperes; a sweep above it is refused.</summary>
    public double MaxCurrentAmps { get; init; } = 0.01;

    /// <summary>Voltage measurement noise of the simulated SMU, volts (1σ); ignored by a real instrument.</summary>
    public double NoiseVolts { get; init; } = 0.00002;

    /// <summary>Serial connection for a real SMU (ignored by the simulator).</summary>
    public PortDefinition? Port { get; init; }
}
