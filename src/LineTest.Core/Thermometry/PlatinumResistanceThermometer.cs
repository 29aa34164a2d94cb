using System.Globalization;

namespace LineTest.Core.Thermometry;

/// <summary>
/// A platinum resistance thermometer by the Callendar–Van Dusen equation of IEC 60751:2008 §5.1.2:
/// R(t) = R0·[1 + A·t + B·t² + C·(t − 100)·t³] for −200 °C ≤ t &lt; 0 °C and R(t) = R0·[1 + A·t + B·t²]
/// for 0 °C ≤ t ≤ 850 °C. The standard coefficients give the Pt100 and Pt1000 of the standard; a
/// calibration certificate may state its own R0, A, B and C.
/// </summary>
public sealed class PlatinumResistanceThermometer : IReferenceSensor
{
    /// <summary>Callendar–Van Dusen A of IEC 60751:2008, °C⁻¹.</summary>
    public const double IecA = 3.9083e-3;

    /// <summary>Callendar–Van Dusen B of IEC 60751:2008, °C⁻².</summary>
    public const double IecB = -5.775e-7;

    /// <summary>Callendar–Van Dusen C of IEC 60751:2008 (below 0 °C only), °C⁻⁴.</summary>
    public const double IecC = -4.183e-12;

    /// <summary>Lower end of the IEC 60751 range, °C.</summary>
    public const double RangeMinC = -200.0;

    /// <summary>Upper end of the IEC 60751 range, °C.</summary>
    public const double RangeMaxC = 850.0;

    private readonly double _lowOhms;
    private readonly double _highOhms;

    /// <summary>
    /// A PRT with the given certificate coefficients; throws when they do not describe a thermometer whose
    /// resistance rises with temperature over −200…850 °C (use <see cref="Validate"/> first for a message list).
    /// </summary>
    public PlatinumResistanceThermometer(double r0Ohms, double a = IecA, double b = IecB, double c = IecC)
    {
        var errors = Validate(r0Ohms, a, b, c);
        if (errors.Count > 0)
        {
            throw new ArgumentException(string.Join("; ", errors));
        }

        R0Ohms = r0Ohms;
        A = a;
        B = b;
        C = c;
        Name = a == IecA && b == IecB && c == IecC && r0Ohms is 100.0 or 1000.0
            ? $"Pt{RangeText.Number(r0Ohms)} (IEC 60751)"
            : $"PRT R0 = {RangeText.Number(r0Ohms)} Ω (Callendar-Van Dusen)";
        _lowOhms = ResistanceOhms(RangeMinC);
        _highOhms = ResistanceOhms(RangeMaxC);
    }

    /// <summary>The standard Pt100: R0 = 100 Ω, IEC 60751 coefficients.</summary>
    public static PlatinumResistanceThermometer Pt100 { get; } = new(100.0);

    /// <summary>The standard Pt1000: R0 = 1000 Ω, IEC 60751 coefficients.</summary>
    public static PlatinumResistanceThermometer Pt1000 { get; } = new(1000.0);

    /// <summary>Resistance at 0 °C, Ω.</summary>
    public double R0Ohms { get; }

    /// <summary>Callendar–Van Dusen A, °C⁻¹.</summary>
    public double A { get; }

    /// <summary>Callendar–Van Dusen B, °C⁻².</summary>
    public double B { get; }

    /// <summary>Callendar–Van Dusen C, °C⁻⁴.</summary>
    public double C { get; }

    /// <inheritdoc />
    public string Name { get; }

    /// <inheritdoc />
    public string RawUnit => RawUnits.Ohm;

    /// <inheritdoc />
    public double MinC => RangeMinC;

    /// <inheritdoc />
    public double MaxC => RangeMaxC;

    /// <summary>
    /// Checks certificate coefficients. Each message starts with the field it concerns (r0, a, b, c).
    /// </summary>
    public static IReadOnlyList<string> Validate(double r0Ohms, double a, double b, double c)
    {
        var errors = new List<string>();
        if (!double.IsFinite(r0Ohms) || r0Ohms <= 0)
        {
            errors.Add($"r0: must be a positive resistance in Ω (100 for Pt100, 1000 for Pt1000), got {RangeText.Number(r0Ohms)}");
        }

        foreach (var (field, value) in new[] { ("a", a), ("b", b), ("c", c) })
        {
            if (!double.IsFinite(value))
            {
                errors.Add($"{field}: must be a finite number, got {RangeText.Exact(value)}");
            }
        }

        if (errors.Count > 0)
        {
            return errors;
        }

        // The inverse needs R(t) to rise strictly over the whole range. Above 0 °C the slope A + 2·B·t is
        // linear, so its ends decide; below 0 °C the cubic slope is checked every 0.5 °C, which is ample for
        // any coefficients near the standard ones (a real PRT's slope varies slowly and never approaches 0).
        var lowestSlope = double.PositiveInfinity;
        var lowestAtC = 0.0;
        for (var t = RangeMinC; t <= RangeMaxC; t += 0.5)
        {
            var slope = RelativeSlope(t, a, b, c);
            if (slope < lowestSlope)
            {
                lowestSlope = slope;
                lowestAtC = t;
            }
        }

        if (!(lowestSlope > 0))
        {
            errors.Add(
                $"a, b, c: resistance must rise with temperature over {RangeText.Number(RangeMinC)} to {RangeText.Number(RangeMaxC)} °C, but these coefficients " +
                $"give a slope of {lowestSlope.ToString("G4", CultureInfo.InvariantCulture)} per °C at {RangeText.Number(lowestAtC)} °C (IEC 60751 values: a = {RangeText.Exact(IecA)}, b = {RangeText.Exact(IecB)}, c = {RangeText.Exact(IecC)})");
        }
        else if (!(RelativeResistance(RangeMinC, a, b, c) > 0))
        {
            errors.Add($"a, b, c: these coefficients give a resistance of zero or less at {RangeText.Number(RangeMinC)} °C");
        }

        return errors;
    }

    /// <summary>R(t) by the Callendar–Van Dusen equation, without a range check, Ω.</summary>
    public double ResistanceOhms(double celsius) => R0Ohms * RelativeResistance(celsius, A, B, C);

    /// <inheritdoc />
    public ConversionResult FromCelsius(double celsius) => RangeText.Forward(this, celsius, ResistanceOhms);

    /// <inheritdoc />
    public ConversionResult ToCelsius(double raw)
    {
        if (RangeText.CheckResistance(this, raw, _lowOhms, _highOhms) is { } unusable)
        {
            return unusable;
        }

        var ratioMinusOne = (raw / R0Ohms) - 1.0;

        // Quadratic branch solved in the form 2x / (A + √(A² + 4Bx)), which avoids the cancellation of
        // (−A + √…)/(2B) when B is small and stays valid when B = 0.
        var quadratic = 2.0 * ratioMinusOne / (A + Math.Sqrt((A * A) + (4.0 * B * ratioMinusOne)));
        if (raw >= R0Ohms)
        {
            return ConversionResult.Success(Math.Max(0.0, quadratic));
        }

        // Below 0 °C the C term makes R(t) a quartic; the quadratic root is an excellent first guess for Newton.
        var celsius = MonotonicInverse.Solve(ResistanceOhms, SensitivityRawPerC, raw, RangeMinC, 0.0, quadratic);
        return ConversionResult.Success(celsius);
    }

    /// <inheritdoc />
    public double SensitivityRawPerC(double celsius) => R0Ohms * RelativeSlope(celsius, A, B, C);

    private static double RelativeResistance(double t, double a, double b, double c) =>
        t < 0.0
            ? 1.0 + (a * t) + (b * t * t) + (c * (t - 100.0) * t * t * t)
            : 1.0 + (a * t) + (b * t * t);

    // d/dt of RelativeResistance: C·(t − 100)·t³ = C·(t⁴ − 100·t³) → C·(4t³ − 300t²).
    private static double RelativeSlope(double t, double a, double b, double c) =>
        t < 0.0
            ? a + (2.0 * b * t) + (c * ((4.0 * t * t * t) - (300.0 * t * t)))
            : a + (2.0 * b * t);
}
