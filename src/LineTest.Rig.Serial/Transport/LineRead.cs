namespace LineTest.Rig.Serial.Transport;

/// <summary>What came back from one attempt to read a line: the line, nothing, or bytes that are not a line.</summary>
/// <param name="Line">The line without its end, when one arrived and is printable.</param>
/// <param name="Problem">Why the bytes are not a line (non-printable byte, too long, no line end), or null.</param>
public sealed record LineRead(string? Line, string? Problem)
{
    /// <summary>True when nothing at all arrived before the deadline.</summary>
    public bool IsSilence => Line is null && Problem is null;
}
