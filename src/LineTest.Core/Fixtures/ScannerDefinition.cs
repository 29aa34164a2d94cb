namespace LineTest.Core.Fixtures;

/// <summary>
/// Where the operator's scans come from. Without a <c>scanner</c> object the station takes scans from the keyboard:
/// a keyboard-wedge scanner types each code and Enter. A serial scanner is used with either rig (the simulator does
/// not stand in for the operator's scanner); its codes go through the same scan rules as typed ones.
/// </summary>
public sealed record ScannerDefinition
{
    /// <summary><c>keyboard</c> (a keyboard-wedge scanner, or typing) or <c>serial</c> (a scanner on a serial port).</summary>
    public required string Kind { get; init; }

    /// <summary>
    /// The serial scanner's port: name and baud rate; <c>timeoutMs</c> is how long one code may take from its first
    /// character to its line end (CR, LF or CR LF); <c>retries</c> is not used (a scanner only sends).
    /// </summary>
    public PortDefinition? Port { get; init; }
}
