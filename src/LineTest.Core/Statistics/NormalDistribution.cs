namespace LineTest.Core.Statistics;

/// <summary>The standard normal distribution: density, CDF, upper tail and quantile.</summary>
public static class NormalDistribution
{
    private const double InverseSqrtTwoPi = 0.39894228040143267794;

    private const double InverseSqrtTwo = 0.70710678118654752440;

    // Acklam's rational approximation to the normal quantile (relative error below 1.2e-9), refined below
    // by one Halley step against the CDF so the result is good to about 1e-15.
    private static readonly double[] A =
    [
        -3.969683028665376e+01, 2.209460984245205e+02, -2.759285104469687e+02,
        1.383577518672690e+02, -3.066479806614716e+01, 2.506628277459239e+00,
    ];

    private static readonly double[] B =
    [
        -5.447609879822406e+01, 1.615858368580409e+02, -1.556989798598866e+02,
        6.680131188771972e+01, -1.328068155288572e+01,
    ];

    private static readonly double[] C =
    [
        -7.784894002430293e-03, -3.223964580411365e-01, -2.400758277161838e+00,
        -2.549732539343734e+00, 4.374664141464968e+00, 2.938163982698783e+00,
    ];

    private static readonly double[] D =
    [
        7.784695709041462e-03, 3.224671290700398e-01, 2.445134137142996e+00, 3.754408661907416e+00,
    ];

    private const double LowBreak = 0.02425;

    /// <summary>Density φ(z).</summary>
    public static double Density(double z) => InverseSqrtTwoPi * Math.Exp(-0.5 * z * z);

    /// <summary>Φ(z) = P(Z ≤ z). Accurate in relative terms far into the lower tail.</summary>
    public static double Cdf(double z)
    {
        if (double.IsNaN(z))
        {
            throw new ArgumentOutOfRangeException(nameof(z), z, "Φ(z) needs a number.");
        }

        var tail = SmallerTail(z);
        return z < 0 ? tail : 1.0 - tail;
    }

    /// <summary>1 − Φ(z) = P(Z &gt; z), computed without cancellation for large z.</summary>
    public static double UpperTail(double z) => Cdf(-z);

    /// <summary>
    /// Φ(−|z|), the probability of the tail on z's side of the mean (at most ½); the other side is 1 minus it
    /// without loss. Φ(−|z|) = ½·erfc(|z|/√2).
    /// </summary>
    internal static double SmallerTail(double z)
    {
        if (double.IsNaN(z))
        {
            throw new ArgumentOutOfRangeException(nameof(z), z, "Φ(z) needs a number.");
        }

        return 0.5 * SpecialFunctions.ErfcNonNegative(Math.Abs(z) * InverseSqrtTwo);
    }

    /// <summary>The quantile z with Φ(z) = p, for 0 &lt; p &lt; 1.</summary>
    public static double Quantile(double p)
    {
        if (!(p > 0 && p < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, "The normal quantile needs 0 < p < 1.");
        }

        double x;
        if (p < LowBreak)
        {
            var q = Math.Sqrt(-2 * Math.Log(p));
            x = (((((((((C[0] * q) + C[1]) * q) + C[2]) * q) + C[3]) * q) + C[4]) * q) + C[5];
            x /= (((((((D[0] * q) + D[1]) * q) + D[2]) * q) + D[3]) * q) + 1;
        }
        else if (p <= 1 - LowBreak)
        {
            var q = p - 0.5;
            var r = q * q;
            x = (((((((((A[0] * r) + A[1]) * r) + A[2]) * r) + A[3]) * r) + A[4]) * r) + A[5];
            x *= q;
            x /= (((((((((B[0] * r) + B[1]) * r) + B[2]) * r) + B[3]) * r) + B[4]) * r) + 1;
        }
        else
        {
            var q = Math.Sqrt(-2 * Math.Log(1 - p));
            x = (((((((((C[0] * q) + C[1]) * q) + C[2]) * q) + C[3]) * q) + C[4]) * q) + C[5];
            x = -x / ((((((((D[0] * q) + D[1]) * q) + D[2]) * q) + D[3]) * q) + 1);
        }

        // One Halley step: e = Φ(x) − p, u = e/φ(x); x ← x − u/(1 + x·u/2). Work in the smaller tail so
        // the residual keeps its relative precision.
        // For x ≥ 0, p ≥ ½ so 1 − p is exact and Φ(x) − p = (1 − p) − (1 − Φ(x)).
        var e = x < 0 ? Cdf(x) - p : (1 - p) - UpperTail(x);

        var u = e / Density(x);
        return x - (u / (1 + (x * u / 2)));
    }
}
