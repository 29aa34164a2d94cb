namespace LineTest.Core.Statistics;

/// <summary>
/// Log-gamma, regularized incomplete gamma and regularized incomplete beta: the building blocks of the
/// normal, chi-square and F distributions. Written here so the core needs no numerics package.
/// </summary>
/// <remarks>
/// Methods: Lanczos approximation (g = 7, nine terms) for ln Γ; power series below x &lt; a + 1 and a
/// continued fraction (modified Lentz) above it for the incomplete gamma; a continued fraction (modified
/// Lentz) for the incomplete beta, with the symmetry I_x(a, b) = 1 − I_{1−x}(b, a) used where the fraction
/// converges slowly. Relative accuracy is about 1e-14 over the ranges the statistics use.
/// </remarks>
public static class SpecialFunctions
{
    // Convergence test of the series and fractions: a few units in the last place of a double.
    private const double Epsilon = 1e-15;
    private const double TinyDouble = 1e-300;
    private const int MaxIterations = 10_000;

    // Lanczos coefficients for g = 7, n = 9; the widely used set that gives about 15 significant digits.
    private static readonly double[] LanczosCoefficients =
    [
        0.99999999999980993,
        676.5203681218851,
        -1259.1392167224028,
        771.32342877765313,
        -176.61502916214059,
        12.507343278686905,
        -0.13857109526572012,
        9.9843695780195716e-6,
        1.5056327351493116e-7,
    ];

    private const double HalfLogTwoPi = 0.91893853320467274178;

    /// <summary>ln Γ(x) for x &gt; 0.</summary>
    public static double LogGamma(double x)
    {
        if (!(x > 0) || double.IsInfinity(x))
        {
            throw new ArgumentOutOfRangeException(nameof(x), x, "ln Γ(x) is defined here for finite x > 0 only.");
        }

        if (x < 0.5)
        {
            // Reflection: Γ(x)Γ(1 − x) = π / sin(πx); keeps the Lanczos series in its accurate range.
            return Math.Log(Math.PI / Math.Sin(Math.PI * x)) - LogGamma(1.0 - x);
        }

        var z = x - 1.0;
        var sum = LanczosCoefficients[0];
        for (var i = 1; i < LanczosCoefficients.Length; i++)
        {
            sum += LanczosCoefficients[i] / (z + i);
        }

        var t = z + 7.5;
        return HalfLogTwoPi + ((z + 0.5) * Math.Log(t)) - t + Math.Log(sum);
    }

    /// <summary>Regularized lower incomplete gamma P(a, x) = γ(a, x)/Γ(a), a &gt; 0, x ≥ 0.</summary>
    public static double GammaP(double a, double x)
    {
        CheckGammaArguments(a, x);
        if (x == 0)
        {
            return 0;
        }

        if (double.IsPositiveInfinity(x))
        {
            return 1;
        }

        var logGammaA = LogGamma(a);
        return x < a + 1.0 ? GammaSeries(a, x, logGammaA) : 1.0 - GammaContinuedFraction(a, x, logGammaA);
    }

    /// <summary>Regularized upper incomplete gamma Q(a, x) = 1 − P(a, x), accurate in the upper tail.</summary>
    public static double GammaQ(double a, double x)
    {
        CheckGammaArguments(a, x);
        if (x == 0)
        {
            return 1;
        }

        if (double.IsPositiveInfinity(x))
        {
            return 0;
        }

        var logGammaA = LogGamma(a);
        return x < a + 1.0 ? 1.0 - GammaSeries(a, x, logGammaA) : GammaContinuedFraction(a, x, logGammaA);
    }

    /// <summary>Regularized incomplete beta I_x(a, b) for a, b &gt; 0 and 0 ≤ x ≤ 1.</summary>
    public static double BetaRegularized(double a, double b, double x)
    {
        if (!(a > 0) || !(b > 0) || double.IsInfinity(a) || double.IsInfinity(b))
        {
            throw new ArgumentOutOfRangeException(nameof(a), $"I_x(a, b) needs finite a > 0 and b > 0; got a = {a}, b = {b}.");
        }

        if (!(x >= 0 && x <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(x), x, "I_x(a, b) needs 0 ≤ x ≤ 1.");
        }

        if (x == 0)
        {
            return 0;
        }

        if (x == 1)
        {
            return 1;
        }

        // Prefactor x^a (1 − x)^b / (a B(a, b)), taken through logs to avoid overflow for large a, b.
        var logFront = LogGamma(a + b) - LogGamma(a) - LogGamma(b) + (a * Math.Log(x)) + (b * Math.Log(1.0 - x));
        var front = Math.Exp(logFront);

        // The fraction converges fast only for x below the mean-like point (a + 1)/(a + b + 2).
        return x < (a + 1.0) / (a + b + 2.0)
            ? front * BetaContinuedFraction(a, b, x) / a
            : 1.0 - (front * BetaContinuedFraction(b, a, 1.0 - x) / b);
    }

    private static void CheckGammaArguments(double a, double x)
    {
        if (!(a > 0) || double.IsInfinity(a))
        {
            throw new ArgumentOutOfRangeException(nameof(a), a, "The incomplete gamma needs finite a > 0.");
        }

        if (!(x >= 0))
        {
            throw new ArgumentOutOfRangeException(nameof(x), x, "The incomplete gamma needs x ≥ 0.");
        }
    }

    // P(a, x) = e^{−x} x^a / Γ(a + 1) · Σ x^n / ((a + 1)…(a + n)).
    private static double GammaSeries(double a, double x, double logGammaA)
    {
        var term = 1.0 / a;
        var sum = term;
        var ap = a;
        for (var n = 0; n < MaxIterations; n++)
        {
            ap += 1.0;
            term *= x / ap;
            sum += term;
            if (Math.Abs(term) < Math.Abs(sum) * Epsilon)
            {
                return sum * Math.Exp((a * Math.Log(x)) - x - logGammaA);
            }
        }

        throw new InvalidOperationException($"Incomplete gamma series did not converge for a = {a}, x = {x}.");
    }

    // Q(a, x) = e^{−x} x^a / Γ(a) · 1/(x + 1 − a − 1·(1 − a)/(x + 3 − a − 2·(2 − a)/(x + 5 − a − …))),
    // evaluated by the modified Lentz method.
    private static double GammaContinuedFraction(double a, double x, double logGammaA)
    {
        var b = x + 1.0 - a;
        var c = 1.0 / TinyDouble;
        var d = 1.0 / b;
        var h = d;
        for (var i = 1; i < MaxIterations; i++)
        {
            var an = -i * (i - a);
            b += 2.0;
            d = (an * d) + b;
            if (Math.Abs(d) < TinyDouble)
            {
                d = TinyDouble;
            }

            c = b + (an / c);
            if (Math.Abs(c) < TinyDouble)
            {
                c = TinyDouble;
            }

            d = 1.0 / d;
            var delta = d * c;
            h *= delta;
            if (Math.Abs(delta - 1.0) < Epsilon)
            {
                return Math.Exp((a * Math.Log(x)) - x - logGammaA) * h;
            }
        }

        throw new InvalidOperationException($"Incomplete gamma continued fraction did not converge for a = {a}, x = {x}.");
    }

    // Continued fraction for I_x(a, b): 1/(1 + d1/(1 + d2/(1 + …))) with
    // d_{2m+1} = −(a + m)(a + b + m) x / ((a + 2m)(a + 2m + 1)), d_{2m} = m (b − m) x / ((a + 2m − 1)(a + 2m)).
    private static double BetaContinuedFraction(double a, double b, double x)
    {
        var qab = a + b;
        var qap = a + 1.0;
        var qam = a - 1.0;
        var c = 1.0;
        var d = 1.0 - (qab * x / qap);
        if (Math.Abs(d) < TinyDouble)
        {
            d = TinyDouble;
        }

        d = 1.0 / d;
        var h = d;
        for (var m = 1; m <= MaxIterations; m++)
        {
            var m2 = 2 * m;

            // Even step.
            var aa = m * (b - m) * x / ((qam + m2) * (a + m2));
            d = 1.0 + (aa * d);
            if (Math.Abs(d) < TinyDouble)
            {
                d = TinyDouble;
            }

            c = 1.0 + (aa / c);
            if (Math.Abs(c) < TinyDouble)
            {
                c = TinyDouble;
            }

            d = 1.0 / d;
            h *= d * c;

            // Odd step.
            aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
            d = 1.0 + (aa * d);
            if (Math.Abs(d) < TinyDouble)
            {
                d = TinyDouble;
            }

            c = 1.0 + (aa / c);
            if (Math.Abs(c) < TinyDouble)
            {
                c = TinyDouble;
            }

            d = 1.0 / d;
            var delta = d * c;
            h *= delta;
            if (Math.Abs(delta - 1.0) < Epsilon)
            {
                return h;
            }
        }

        throw new InvalidOperationException($"Incomplete beta continued fraction did not converge for a = {a}, b = {b}, x = {x}.");
    }
}
