namespace LineTest.Rig.Serial.Twins;

/// <summary>Port settings of a simulated serial rig. The twins answer at once, so short timeouts are safe.</summary>
public sealed record SimulatedSerialRigOptions
{
    /// <summary>Reply timeout per command, ms. Default 250: long enough for a loaded 2-core machine, short enough that a silent unit costs under a second.</summary>
    public int TimeoutMs { get; init; } = 250;

    /// <summary>Retries of idempotent queries. Default 1.</summary>
    public int Retries { get; init; } = 1;

    /// <summary>Baud rate written into the fixture (a pseudo-terminal ignores it). Default 115200.</summary>
    public int Baud { get; init; } = 115200;

    /// <summary>Folder for the port links; a new temporary folder (removed on dispose) when null.</summary>
    public string? PortDirectory { get; init; }
}
