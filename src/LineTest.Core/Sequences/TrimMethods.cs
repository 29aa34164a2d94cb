namespace LineTest.Core.Sequences;

/// <summary>The words a sequence's <c>trim.method</c> accepts.</summary>
public static class TrimMethods
{
    /// <summary>Gain and offset DAC codes written over the unit link.</summary>
    public const string Dac = "dac";

    /// <summary>Select-on-test resistors from an IEC 60063 E-series, fitted by the operator.</summary>
    public const string Resistor = "resistor";

    /// <summary>Fixed-point firmware coefficients written over the unit link.</summary>
    public const string Firmware = "firmware";

    /// <summary>Every accepted method, in the order they are listed to the engineer.</summary>
    public static IReadOnlyList<string> All { get; } = [Dac, Resistor, Firmware];
}
