using System.Globalization;

namespace LineTest.Core.Thermometry;

/// <summary>Formats numbers and ranges in the failure messages of the sensors (invariant culture).</summary>
internal static class RangeText
{
    public static string Number(double value) =>
        double.IsFinite(value) ? value.ToString("0.####", CultureInfo.InvariantCulture) : value.ToString(CultureInfo.InvariantCulture);

    /// <summary>Coefficients and small numbers: shortest round-trip form, invariant culture (e.g. 8.76741E-08).</summary>
    public static string Exact(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    public static string Unit(string rawUnit) => rawUnit switch
    {
        RawUnits.Ohm => "Ω",
        RawUnits.Celsius => "°C",
        _ => rawUnit,
    };

    public static ConversionResult TemperatureOutOfRange(IReferenceSensor sensor, double celsius) =>
        ConversionResult.Failure(
            $"temperature {Number(celsius)} °C is outside the valid range {Number(sensor.MinC)} to {Number(sensor.MaxC)} °C of {sensor.Name}");

    public static ConversionResult RawOutOfRange(IReferenceSensor sensor, string quantity, double raw, double rawLow, double rawHigh)
    {
        var unit = Unit(sensor.RawUnit);
        return ConversionResult.Failure(
            $"{quantity} {Number(raw)} {unit} is outside the valid range {Number(rawLow)} to {Number(rawHigh)} {unit} " +
            $"({Number(sensor.MinC)} to {Number(sensor.MaxC)} °C) of {sensor.Name}");
    }

    public static ConversionResult NotANumber(IReferenceSensor sensor, string quantity) =>
        ConversionResult.Failure($"{quantity} is not a finite number; {sensor.Name} needs a value in {Unit(sensor.RawUnit)}");

    /// <summary>°C to the raw quantity with the checks every resistive sensor shares: finite, inside the sensor's range.</summary>
    public static ConversionResult Forward(IReferenceSensor sensor, double celsius, Func<double, double> rawAt)
    {
        if (!double.IsFinite(celsius))
        {
            return ConversionResult.Failure($"temperature is not a finite number; {sensor.Name} needs °C");
        }

        return celsius < sensor.MinC || celsius > sensor.MaxC
            ? TemperatureOutOfRange(sensor, celsius)
            : ConversionResult.Success(rawAt(celsius));
    }

    /// <summary>The failure for a raw resistance that is not a number or outside the sensor's range, or null when usable.</summary>
    public static ConversionResult? CheckResistance(IReferenceSensor sensor, double ohms, double lowOhms, double highOhms)
    {
        if (!double.IsFinite(ohms))
        {
            return NotANumber(sensor, "resistance");
        }

        return ohms < lowOhms || ohms > highOhms ? RawOutOfRange(sensor, "resistance", ohms, lowOhms, highOhms) : null;
    }
}
