using LineTest.Rig.Serial.Scanner;

namespace LineTest.Station.Hosting;

/// <summary>One thing from the operator's side of the station, in the order it happened.</summary>
/// <param name="Kind">Typed line, serial scan, or scanner notice.</param>
/// <param name="Text">The typed line or the notice; null for a scan.</param>
/// <param name="Scan">The scan; null otherwise.</param>
public sealed record OperatorEntry(OperatorEntryKind Kind, string? Text, ScanResult? Scan)
{
    /// <summary>A typed line.</summary>
    public static OperatorEntry Typed(string line) => new(OperatorEntryKind.Typed, line, null);

    /// <summary>A code from the serial scanner.</summary>
    public static OperatorEntry Scanned(ScanResult scan) => new(OperatorEntryKind.Scanned, null, scan);

    /// <summary>News about the serial scanner.</summary>
    public static OperatorEntry Notice(string text) => new(OperatorEntryKind.ScannerNotice, text, null);
}
