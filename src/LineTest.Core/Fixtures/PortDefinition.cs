namespace LineTest.Core.Fixtures;

/// <summary>Serial port settings of one instrument or unit link.</summary>
public sealed record PortDefinition
{
    /// <summary>Port name, e.g. <c>/dev/ttyUSB0</c> or <c>COM3</c>.</summary>
    public required string Name { get; init; }

    /// <summary>Baud rate.</summary>
    public int Baud { get; init; } = 9600;

    /// <summary>Reply timeout per command, milliseconds.</summary>
    public int TimeoutMs { get; init; } = 1000;

    /// <summary>How many times an idempotent query is retried after a timeout or garbage reply.</summary>
    public int Retries { get; init; } = 2;
}
