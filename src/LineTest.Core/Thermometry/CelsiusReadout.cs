namespace LineTest.Core.Thermometry;

/// <summary>
/// A readout that reports °C by itself (it applies its own sensor model): the raw value is the temperature.
/// </summary>
public sealed class CelsiusReadout : IReferenceSensor
{
    /// <summary>Lower end: absolute zero, °C.</summary>
    public const double RangeMinC = -273.15;

    /// <summary>
    /// Upper end, °C: the top of the type K range (NIST Monograph 175), above any contact thermometer a
    /// dry block, bath or chamber station would use; a value beyond it is a garbled reading.
    /// </summary>
    public const double RangeMaxC = 1372.0;

    /// <summary>The single instance (the readout has no parameters).</summary>
    public static CelsiusReadout Instance { get; } = new();

    private CelsiusReadout()
    {
    }

    /// <inheritdoc />
    public string Name => "°C readout";

    /// <inheritdoc />
    public string RawUnit => RawUnits.Celsius;

    /// <inheritdoc />
    public double MinC => RangeMinC;

    /// <inheritdoc />
    public double MaxC => RangeMaxC;

    /// <inheritdoc />
    public ConversionResult FromCelsius(double celsius) => Identity(celsius);

    /// <inheritdoc />
    public ConversionResult ToCelsius(double raw) => Identity(raw);

    /// <inheritdoc />
    public double SensitivityRawPerC(double celsius) => 1.0;

    private ConversionResult Identity(double celsius)
    {
        if (!double.IsFinite(celsius))
        {
            return RangeText.NotANumber(this, "temperature");
        }

        return celsius is < RangeMinC or > RangeMaxC
            ? RangeText.TemperatureOutOfRange(this, celsius)
            : ConversionResult.Success(celsius);
    }
}
