namespace LineTest.Core.Thermometry;

/// <summary>
/// An NTC thermistor by the Steinhart–Hart equation 1/T = A + B·ln R + C·(ln R)³ (T in K, R in Ω),
/// Steinhart and Hart, Deep-Sea Research 15 (1968). The inverse (temperature to resistance) solves the
/// depressed cubic in ln R in closed form and polishes the root with one Newton step.
/// </summary>
public sealed class SteinhartHartThermistor : IReferenceSensor
{
    private readonly double _lowOhms;
    private readonly double _highOhms;

    /// <summary>
    /// A thermistor with the given coefficients over [<paramref name="minC"/>, <paramref name="maxC"/>];
    /// throws when they are invalid (use <see cref="Validate"/> first for a message list).
    /// </summary>
    public SteinhartHartThermistor(
        double a,
        double b,
        double c,
        double minC = ThermistorRange.DefaultMinC,
        double maxC = ThermistorRange.DefaultMaxC)
    {
        var errors = Validate(a, b, c, minC, maxC);
        if (errors.Count > 0)
        {
            throw new ArgumentException(string.Join("; ", errors));
        }

        A = a;
        B = b;
        C = c;
        MinC = minC;
        MaxC = maxC;
        Name = "NTC thermistor (Steinhart-Hart)";

        // Resistance falls as temperature rises: the hot end gives the lowest resistance.
        _lowOhms = ResistanceOhms(maxC);
        _highOhms = ResistanceOhms(minC);
    }

    /// <summary>Steinhart–Hart A, K⁻¹.</summary>
    public double A { get; }

    /// <summary>Steinhart–Hart B, K⁻¹.</summary>
    public double B { get; }

    /// <summary>Steinhart–Hart C, K⁻¹.</summary>
    public double C { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public string RawUnit => RawUnits.Ohm;

    /// <inheritdoc />
    public double MinC { get; }

    /// <inheritdoc />
    public double MaxC { get; }

    /// <summary>
    /// Checks the coefficients: B &gt; 0 and C ≥ 0 make 1/T strictly increasing in ln R, so every
    /// temperature has exactly one resistance (an NTC). Each message starts with its field (a, b, c).
    /// </summary>
    public static IReadOnlyList<string> Validate(
        double a,
        double b,
        double c,
        double minC = ThermistorRange.DefaultMinC,
        double maxC = ThermistorRange.DefaultMaxC)
    {
        var errors = new List<string>();
        if (!double.IsFinite(a))
        {
            errors.Add($"a: must be a finite number, got {RangeText.Exact(a)}");
        }

        if (!double.IsFinite(b) || b <= 0)
        {
            errors.Add($"b: must be a positive number for an NTC thermistor (about 2.3e-4 for 10 kΩ parts), got {RangeText.Number(b)}");
        }

        if (!double.IsFinite(c) || c < 0)
        {
            errors.Add($"c: must be zero or positive (about 1e-7 for 10 kΩ parts), got {RangeText.Exact(c)}");
        }

        ThermistorRange.AddRangeErrors(errors, minC, maxC);
        return errors;
    }

    /// <summary>R(t) without a range check, Ω.</summary>
    public double ResistanceOhms(double celsius) => Math.Exp(LogResistance(celsius));

    /// <inheritdoc />
    public ConversionResult FromCelsius(double celsius) => RangeText.Forward(this, celsius, ResistanceOhms);

    /// <inheritdoc />
    public ConversionResult ToCelsius(double raw)
    {
        if (RangeText.CheckResistance(this, raw, _lowOhms, _highOhms) is { } unusable)
        {
            return unusable;
        }

        var logR = Math.Log(raw);
        var inverseK = A + (B * logR) + (C * logR * logR * logR);
        return ConversionResult.Success((1.0 / inverseK) - ThermistorRange.ZeroCelsiusK);
    }

    /// <inheritdoc />
    public double SensitivityRawPerC(double celsius)
    {
        // From 1/T = g(L), L = ln R: dL/dT = −1/(T²·g'(L)), g'(L) = B + 3·C·L², and dR/dT = R·dL/dT.
        var kelvin = celsius + ThermistorRange.ZeroCelsiusK;
        var logR = LogResistance(celsius);
        return -Math.Exp(logR) / (kelvin * kelvin * (B + (3.0 * C * logR * logR)));
    }

    private double LogResistance(double celsius)
    {
        var kelvin = celsius + ThermistorRange.ZeroCelsiusK;
        var target = 1.0 / kelvin;

        // C·L³ + B·L + (A − 1/T) = 0. With C = 0 it is linear.
        if (C == 0)
        {
            return (target - A) / B;
        }

        // Depressed cubic L³ + p·L + q = 0 with p = B/C > 0 has one real root, written with sinh/asinh,
        // which (unlike Cardano's two cube roots) loses no digits by cancellation:
        // L = −2·√(p/3)·sinh(asinh((3q/(2p))·√(3/p)) / 3).
        var p = B / C;
        var q = (A - target) / C;
        var logR = -2.0 * Math.Sqrt(p / 3.0) * Math.Sinh(Math.Asinh(3.0 * q / (2.0 * p) * Math.Sqrt(3.0 / p)) / 3.0);

        // One Newton step on f(L) = C·L³ + B·L + A − 1/T removes the last rounding error of the closed form.
        var residual = (C * logR * logR * logR) + (B * logR) + (A - target);
        return logR - (residual / ((3.0 * C * logR * logR) + B));
    }
}
