namespace LineTest.Core.Thermometry;

/// <summary>
/// An NTC thermistor by the beta model R(T) = R25·exp(β·(1/T − 1/T0)), T0 = 298.15 K (25 °C), T in K.
/// Both directions are closed-form.
/// </summary>
public sealed class BetaThermistor : IReferenceSensor
{
    /// <summary>The model's reference temperature T0, K (25 °C).</summary>
    public const double ReferenceK = 298.15;

    private readonly double _lowOhms;
    private readonly double _highOhms;

    /// <summary>
    /// A thermistor with the given R25 and β over [<paramref name="minC"/>, <paramref name="maxC"/>];
    /// throws when they are invalid (use <see cref="Validate"/> first for a message list).
    /// </summary>
    public BetaThermistor(
        double r25Ohms,
        double betaK,
        double minC = ThermistorRange.DefaultMinC,
        double maxC = ThermistorRange.DefaultMaxC)
    {
        var errors = Validate(r25Ohms, betaK, minC, maxC);
        if (errors.Count > 0)
        {
            throw new ArgumentException(string.Join("; ", errors));
        }

        R25Ohms = r25Ohms;
        BetaK = betaK;
        MinC = minC;
        MaxC = maxC;
        Name = $"NTC thermistor (beta model, R25 = {RangeText.Number(r25Ohms)} Ω, β = {RangeText.Number(betaK)} K)";
        _lowOhms = ResistanceOhms(maxC);
        _highOhms = ResistanceOhms(minC);
    }

    /// <summary>Resistance at 25 °C, Ω.</summary>
    public double R25Ohms { get; }

    /// <summary>β, K.</summary>
    public double BetaK { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public string RawUnit => RawUnits.Ohm;

    /// <inheritdoc />
    public double MinC { get; }

    /// <inheritdoc />
    public double MaxC { get; }

    /// <summary>Checks R25 and β; each message starts with its field (r25, beta).</summary>
    public static IReadOnlyList<string> Validate(
        double r25Ohms,
        double betaK,
        double minC = ThermistorRange.DefaultMinC,
        double maxC = ThermistorRange.DefaultMaxC)
    {
        var errors = new List<string>();
        if (!double.IsFinite(r25Ohms) || r25Ohms <= 0)
        {
            errors.Add($"r25: must be a positive resistance in Ω, got {RangeText.Number(r25Ohms)}");
        }

        if (!double.IsFinite(betaK) || betaK <= 0)
        {
            errors.Add($"beta: must be a positive number of kelvin (typically 3000 to 5000 K), got {RangeText.Number(betaK)}");
        }

        ThermistorRange.AddRangeErrors(errors, minC, maxC);
        return errors;
    }

    /// <summary>R(t) without a range check, Ω.</summary>
    public double ResistanceOhms(double celsius) =>
        R25Ohms * Math.Exp(BetaK * ((1.0 / (celsius + ThermistorRange.ZeroCelsiusK)) - (1.0 / ReferenceK)));

    /// <inheritdoc />
    public ConversionResult FromCelsius(double celsius) => RangeText.Forward(this, celsius, ResistanceOhms);

    /// <inheritdoc />
    public ConversionResult ToCelsius(double raw)
    {
        if (RangeText.CheckResistance(this, raw, _lowOhms, _highOhms) is { } unusable)
        {
            return unusable;
        }

        // 1/T = 1/T0 + ln(R/R25)/β.
        var inverseK = (1.0 / ReferenceK) + (Math.Log(raw / R25Ohms) / BetaK);
        return ConversionResult.Success((1.0 / inverseK) - ThermistorRange.ZeroCelsiusK);
    }

    /// <inheritdoc />
    public double SensitivityRawPerC(double celsius)
    {
        // dR/dT = −β·R/T².
        var kelvin = celsius + ThermistorRange.ZeroCelsiusK;
        return -BetaK * ResistanceOhms(celsius) / (kelvin * kelvin);
    }
}
