namespace LineTest.Rig.Serial.Scanner;

/// <summary>Where the operator's scans come from: a keyboard-wedge scanner (typed lines) or a serial scanner.</summary>
public interface IBarcodeScanner
{
    /// <summary>Waits for the next scan. A scan that is not a serial is a result, not an exception.</summary>
    Task<ScanResult> NextAsync(CancellationToken cancellationToken);
}
