namespace LineTest.Rig.Serial.Scanner;

/// <summary>One scan: a serial, a scan that is not a serial (and why), or the end of input.</summary>
public sealed record ScanResult
{
    private ScanResult(string? serial, string? problem, bool endOfInput)
    {
        Serial = serial;
        Problem = problem;
        EndOfInput = endOfInput;
    }

    /// <summary>The serial read, or null.</summary>
    public string? Serial { get; }

    /// <summary>Why the scan is not a serial, or null.</summary>
    public string? Problem { get; }

    /// <summary>True when the input has ended (keyboard closed); no more scans will come.</summary>
    public bool EndOfInput { get; }

    /// <summary>The end of input.</summary>
    public static ScanResult End { get; } = new(null, null, true);

    /// <summary>A good serial.</summary>
    public static ScanResult Of(string serial) => new(serial, null, false);

    /// <summary>A scan that is not a serial.</summary>
    public static ScanResult Rejected(string problem) => new(null, problem, false);
}
