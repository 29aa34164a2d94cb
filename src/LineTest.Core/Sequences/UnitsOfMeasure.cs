namespace LineTest.Core.Sequences;

/// <summary>The units of measure a sequence may use, and their scale to the base unit.</summary>
public static class UnitsOfMeasure
{
    private static readonly Dictionary<string, (string Base, double Scale)> Known = new(StringComparer.Ordinal)
    {
        ["V"] = ("V", 1),
        ["mV"] = ("V", 1e-3),
        ["uV"] = ("V", 1e-6),
        ["A"] = ("A", 1),
        ["mA"] = ("A", 1e-3),
        ["uA"] = ("A", 1e-6),
        ["ohm"] = ("ohm", 1),
        ["kohm"] = ("ohm", 1e3),
        ["degC"] = ("degC", 1),
        ["K"] = ("K", 1),
        ["mV/degC"] = ("V/degC", 1e-3),
        ["%"] = ("%", 1),
        ["count"] = ("count", 1),
        ["1"] = ("1", 1),
    };

    /// <summary>All symbols accepted in a sequence.</summary>
    public static IReadOnlyCollection<string> Symbols => Known.Keys;

    /// <summary>True when <paramref name="symbol"/> is a known unit (case-sensitive: mV is not MV).</summary>
    public static bool IsKnown(string? symbol) => symbol is not null && Known.ContainsKey(symbol);

    /// <summary>Converts a value in the base unit (V, A, ohm…) to <paramref name="symbol"/>.</summary>
    public static double FromBase(double value, string symbol) => value / Known[symbol].Scale;

    /// <summary>The base unit a symbol scales from, e.g. V for mV.</summary>
    public static string BaseOf(string symbol) => Known[symbol].Base;
}
