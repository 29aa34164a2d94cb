namespace LineTest.Rig.Serial.Scanner;

/// <summary>A keyboard-wedge scanner: it types each code followed by Enter, so every line of the reader is one scan.</summary>
public sealed class KeyboardScanner : IBarcodeScanner
{
    private readonly TextReader _reader;

    /// <summary>Reads scans from <paramref name="reader"/> (normally the console).</summary>
    public KeyboardScanner(TextReader reader)
    {
        ArgumentNullException.ThrowIfNull(reader);
        _reader = reader;
    }

    /// <inheritdoc/>
    public async Task<ScanResult> NextAsync(CancellationToken cancellationToken)
    {
        var line = await _reader.ReadLineAsync(cancellationToken).ConfigureAwait(false);
        return line is null ? ScanResult.End : SerialText.Check(line);
    }
}
