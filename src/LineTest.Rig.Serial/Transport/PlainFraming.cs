namespace LineTest.Rig.Serial.Transport;

/// <summary>A message is the line itself (SCPI and the source and readout protocols).</summary>
public sealed class PlainFraming : ILineFraming
{
    /// <summary>The one instance.</summary>
    public static PlainFraming Instance { get; } = new();

    /// <inheritdoc/>
    public string Encode(string body) => body;

    /// <inheritdoc/>
    public ReplyParse<string> Decode(string line) => ReplyParse<string>.Ok(line);
}
