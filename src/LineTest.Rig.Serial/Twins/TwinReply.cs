namespace LineTest.Rig.Serial.Twins;

/// <summary>What a simulated instrument does with one command: answer, stay silent, send junk, or drop its port.</summary>
public sealed record TwinReply
{
    private TwinReply(string? line, byte[]? junk, bool hangUp)
    {
        Line = line;
        Junk = junk;
        HangUp = hangUp;
    }

    /// <summary>A reply message (framed by the server), or null.</summary>
    public string? Line { get; }

    /// <summary>Raw bytes sent as they are, or null.</summary>
    public IReadOnlyList<byte>? Junk { get; }

    /// <summary>True when the port is to disappear (the master end is closed).</summary>
    public bool HangUp { get; }

    /// <summary>No reply (a SCPI setting, or a silent instrument).</summary>
    public static TwinReply Silence { get; } = new(null, null, false);

    /// <summary>The port disappears.</summary>
    public static TwinReply Unplug { get; } = new(null, null, true);

    /// <summary>Answers <paramref name="line"/>.</summary>
    public static TwinReply Answer(string line)
    {
        ArgumentNullException.ThrowIfNull(line);
        return new(line, null, false);
    }

    /// <summary>Sends <paramref name="bytes"/> unframed (garbage, or a deliberately corrupted frame).</summary>
    public static TwinReply Raw(byte[] bytes)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        return new(null, bytes, false);
    }
}
