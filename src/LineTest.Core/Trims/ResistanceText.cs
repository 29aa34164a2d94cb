using System.Globalization;

namespace LineTest.Core.Trims;

/// <summary>Resistances as operators read them: 12.1 kΩ, 470 Ω, 1.5 MΩ.</summary>
public static class ResistanceText
{
    private static readonly (double Scale, string Prefix)[] Prefixes =
    [
        (1e9, "G"),
        (1e6, "M"),
        (1e3, "k"),
        (1.0, string.Empty),
        (1e-3, "m"),
    ];

    /// <summary>Formats ohms with an SI prefix and at most <paramref name="significantDigits"/> significant digits.</summary>
    public static string Format(double ohms, int significantDigits = 4)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(significantDigits, 1);
        if (!double.IsFinite(ohms))
        {
            return ohms > 0 ? "open" : ohms.ToString(CultureInfo.InvariantCulture) + " Ω";
        }

        if (ohms == 0.0)
        {
            return "0 Ω";
        }

        // Round to the significant digits first, so 999.96 kΩ becomes 1 MΩ rather than 1000 kΩ.
        var magnitude = Math.Floor(Math.Log10(Math.Abs(ohms)));
        var unit = Math.Pow(10, magnitude - significantDigits + 1);
        var rounded = Math.Round(ohms / unit) * unit;

        foreach (var (scale, prefix) in Prefixes)
        {
            if (Math.Abs(rounded) >= scale || scale == Prefixes[^1].Scale)
            {
                var scaled = Math.Round(rounded / scale, 6);
                return scaled.ToString("0.######", CultureInfo.InvariantCulture) + " " + prefix + "Ω";
            }
        }

        throw new InvalidOperationException("Unreachable: the last prefix always matches.");
    }
}
