namespace LineTest.Core.Thermometry;

/// <summary>Thermocouple types supported, letter designations of IEC 60584-1 and NIST Monograph 175.</summary>
public enum ThermocoupleType
{
    /// <summary>Type K (nickel-chromium / nickel-aluminium), −270 … 1372 °C.</summary>
    K,

    /// <summary>Type T (copper / copper-nickel), −270 … 400 °C.</summary>
    T,
}
