namespace LineTest.Core.Thermometry;

/// <summary>Default valid range of the thermistor models and its checks.</summary>
public static class ThermistorRange
{
    /// <summary>
    /// Default lower end, °C: a typical epoxy or glass NTC reference thermistor's rated range, and the span
    /// over which a three-term Steinhart–Hart fit stays within a few millikelvin [common practice].
    /// </summary>
    public const double DefaultMinC = -50.0;

    /// <summary>Default upper end, °C [common practice].</summary>
    public const double DefaultMaxC = 150.0;

    /// <summary>Kelvin at 0 °C, exact (SI).</summary>
    public const double ZeroCelsiusK = 273.15;

    internal static void AddRangeErrors(List<string> errors, double minC, double maxC)
    {
        if (!double.IsFinite(minC) || !double.IsFinite(maxC) || minC <= -ZeroCelsiusK || minC >= maxC)
        {
            errors.Add(
                $"range: the valid range must be finite, above -273.15 °C and increasing, got {RangeText.Number(minC)} to {RangeText.Number(maxC)} °C");
        }
    }
}
