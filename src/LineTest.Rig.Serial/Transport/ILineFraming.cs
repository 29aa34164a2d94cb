namespace LineTest.Rig.Serial.Transport;

/// <summary>How a protocol wraps a message in one line (the line end is added and removed by the transport).</summary>
public interface ILineFraming
{
    /// <summary>The line text for a message body.</summary>
    string Encode(string body);

    /// <summary>The message body of a received line, or why the line is not a valid frame.</summary>
    ReplyParse<string> Decode(string line);
}
