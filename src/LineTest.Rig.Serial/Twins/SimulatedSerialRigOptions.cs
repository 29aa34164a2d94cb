namespace LineTest.Rig.Serial.Twins;

/// <summary>Port settings of a simulated serial rig. The twins answer at once, so short timeouts are safe.</summary>
public sealed record SimulatedSerialRigOptions
{
    /// <summary>Reply timeout per command, ms. Default 1000 (the port default): the twins answer within milliseconds, but a busy machine can hold a thread back for a good part of a second.</summary>
    public int TimeoutMs { get; init; } = 1000;

    /// <summary>Reply timeout of the unit links, ms; <see cref="TimeoutMs"/> when null. Lets a test make a silent unit cheap without shortening the instruments' timeouts.</summary>
    public int? UnitTimeoutMs { get; init; }

    /// <summary>
    /// Reply timeouts by instrument name (<c>source</c>, <c>reference</c>, <c>meter</c>, <c>unit slot N</c>), ms, overriding
    /// <see cref="TimeoutMs"/> and <see cref="UnitTimeoutMs"/>. Lets a test make one silent instrument cheap.
    /// </summary>
    public IReadOnlyDictionary<string, int>? TimeoutsMs { get; init; }

    /// <summary>Retries of idempotent queries. Default 2, as in the committed real fixture.</summary>
    public int Retries { get; init; } = 2;

    /// <summary>Baud rate written into the fixture (a pseudo-terminal ignores it). Default 115200.</summary>
    public int Baud { get; init; } = 115200;

    /// <summary>Folder for the port links; a new temporary folder (removed on dispose) when null.</summary>
    public string? PortDirectory { get; init; }
}
