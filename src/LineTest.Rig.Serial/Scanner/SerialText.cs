using System.Globalization;

namespace LineTest.Rig.Serial.Scanner;

/// <summary>What a scanned serial may look like: 1 to 40 characters of A–Z, a–z, 0–9, '-', '_', '.', '/'.</summary>
public static class SerialText
{
    /// <summary>Longest serial accepted.</summary>
    public const int MaxLength = 40;

    /// <summary>Checks one scanned line (surrounding white space is dropped).</summary>
    public static ScanResult Check(string line)
    {
        ArgumentNullException.ThrowIfNull(line);
        var serial = line.Trim();
        if (serial.Length == 0)
        {
            return ScanResult.Rejected("an empty scan");
        }

        if (serial.Length > MaxLength)
        {
            return ScanResult.Rejected(string.Create(CultureInfo.InvariantCulture, $"'{serial[..20]}…' is {serial.Length} characters long; a serial has at most {MaxLength}"));
        }

        for (var i = 0; i < serial.Length; i++)
        {
            var c = serial[i];
            if (!(char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' or '/'))
            {
                return ScanResult.Rejected(string.Create(CultureInfo.InvariantCulture,
                    $"'{serial}' has '{(char.IsControl(c) ? $"\\u{(int)c:X4}" : c.ToString())}' at position {i + 1}; a serial has only letters, digits and - _ . /"));
            }
        }

        return ScanResult.Of(serial);
    }
}
