namespace LineTest.Core.Thermometry;

/// <summary>
/// A reference thermometer's sensor model: converts the readout's raw value (Ω, mV or °C) to °C and back,
/// over a stated valid range. Implementations are immutable and thread-safe.
/// </summary>
public interface IReferenceSensor
{
    /// <summary>A short name for messages and reports, e.g. "Pt100 (IEC 60751)".</summary>
    string Name { get; }

    /// <summary>The raw unit: <see cref="RawUnits.Ohm"/>, <see cref="RawUnits.Millivolt"/> or <see cref="RawUnits.Celsius"/>.</summary>
    string RawUnit { get; }

    /// <summary>Lowest temperature of the valid range, °C.</summary>
    double MinC { get; }

    /// <summary>Highest temperature of the valid range, °C.</summary>
    double MaxC { get; }

    /// <summary>Converts a raw reading to °C; a failure names the valid range when the reading lies outside it.</summary>
    ConversionResult ToCelsius(double raw);

    /// <summary>Converts a temperature in °C to the raw reading; a failure names the valid range.</summary>
    ConversionResult FromCelsius(double celsius);

    /// <summary>
    /// d(raw)/d(°C) at the given temperature (negative for an NTC thermistor), used to carry raw-unit
    /// uncertainties (readout resolution, meter specification) into °C.
    /// </summary>
    double SensitivityRawPerC(double celsius);
}
