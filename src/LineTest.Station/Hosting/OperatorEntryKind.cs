namespace LineTest.Station.Hosting;

/// <summary>Where an <see cref="OperatorEntry"/> came from.</summary>
public enum OperatorEntryKind
{
    /// <summary>A line typed on the keyboard (or by a keyboard-wedge scanner) and Enter.</summary>
    Typed,

    /// <summary>A code from the serial scanner: a serial, or a scan that is not one and why.</summary>
    Scanned,

    /// <summary>News about the serial scanner for the operator (lost, back).</summary>
    ScannerNotice,
}
