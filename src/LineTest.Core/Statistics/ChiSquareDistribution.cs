namespace LineTest.Core.Statistics;

/// <summary>The chi-square distribution with ν degrees of freedom.</summary>
public static class ChiSquareDistribution
{
    /// <summary>P(X ≤ x) = P(ν/2, x/2).</summary>
    public static double Cdf(double degreesOfFreedom, double x)
    {
        CheckDegreesOfFreedom(degreesOfFreedom);
        return x <= 0 ? 0 : SpecialFunctions.GammaP(degreesOfFreedom / 2, x / 2);
    }

    /// <summary>P(X &gt; x) = Q(ν/2, x/2), accurate in the upper tail.</summary>
    public static double UpperTail(double degreesOfFreedom, double x)
    {
        CheckDegreesOfFreedom(degreesOfFreedom);
        return x <= 0 ? 1 : SpecialFunctions.GammaQ(degreesOfFreedom / 2, x / 2);
    }

    /// <summary>The x with P(X ≤ x) = p, for 0 &lt; p &lt; 1.</summary>
    public static double Quantile(double degreesOfFreedom, double p)
    {
        CheckDegreesOfFreedom(degreesOfFreedom);
        if (!(p > 0 && p < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, "The chi-square quantile needs 0 < p < 1.");
        }

        // Start from the Wilson–Hilferty cube-root normal approximation, then solve P(ν/2, x/2) = p by
        // Newton steps kept inside a bracket that bisection shrinks whenever Newton would leave it.
        var k = degreesOfFreedom;
        var z = NormalDistribution.Quantile(p);
        var h = 2.0 / (9.0 * k);
        var cube = 1.0 - h + (z * Math.Sqrt(h));
        // Where the cube goes negative (small ν, small p) use the leading term of the series instead:
        // P(a, y) ≈ y^a / Γ(a + 1), so x = 2·(p·Γ(a + 1))^{1/a}.
        var x = cube > 0
            ? k * cube * cube * cube
            : 2 * Math.Pow(p * Math.Exp(SpecialFunctions.LogGamma((k / 2) + 1)), 2 / k);
        if (!(x > 0) || double.IsInfinity(x))
        {
            x = k;
        }

        double low = 0;
        var high = double.PositiveInfinity;
        var a = k / 2;
        var logGammaA = SpecialFunctions.LogGamma(a);
        for (var i = 0; i < 200; i++)
        {
            // Use the smaller tail for the residual so tiny upper-tail probabilities keep their precision.
            var f = p < 0.5 ? Cdf(k, x) - p : (1 - p) - UpperTail(k, x);
            if (f == 0)
            {
                return x;
            }

            if (f < 0)
            {
                low = x;
            }
            else
            {
                high = x;
            }

            // Density of chi-square: x^{a−1} e^{−x/2} / (2^a Γ(a)).
            var density = Math.Exp(((a - 1) * Math.Log(x)) - (x / 2) - (a * Math.Log(2)) - logGammaA);
            var next = density > 0 ? x - (f / density) : double.NaN;
            if (!(next > low && next < high))
            {
                next = double.IsPositiveInfinity(high) ? Math.Max(2 * x, x + 1) : 0.5 * (low + high);
            }

            if (Math.Abs(next - x) <= 1e-14 * Math.Max(1, x))
            {
                return next;
            }

            x = next;
        }

        return x;
    }

    private static void CheckDegreesOfFreedom(double degreesOfFreedom)
    {
        if (!(degreesOfFreedom > 0) || double.IsInfinity(degreesOfFreedom))
        {
            throw new ArgumentOutOfRangeException(nameof(degreesOfFreedom), degreesOfFreedom, "Chi-square needs finite degrees of freedom > 0.");
        }
    }
}
