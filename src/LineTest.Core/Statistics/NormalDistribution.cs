namespace LineTest.Core.Statistics;

/// <summary>The standard normal distribution: density, CDF, upper tail and quantile.</summary>
public static class NormalDistribution
{
    private const double InverseSqrtTwoPi = 0.39894228040143267794;

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
    /// without loss.
    /// </summary>
    /// <remarks>
    /// W. J. Cody's rational Chebyshev approximations for the normal integral (the ANORM routine of Cody, "Algorithm
    /// 715", ACM Transactions on Mathematical Software 19 (1993), after Cody, Mathematics of Computation 23 (1969)),
    /// good to about 1e-16 relative in each of its three ranges: |z| ≤ 0.66291, to √32, and beyond (an asymptotic
    /// form in 1/z²). exp(−z²/2) is taken as the product of two exponentials split at z rounded to 1/16, so the
    /// rounding of z² does not cost relative precision far in the tail. About a tenth of the time of ½·erfc(|z|/√2)
    /// by the incomplete gamma function Q(½, z²/2), which was used before; the normality test calls it once per
    /// value.
    /// </remarks>
    internal static double SmallerTail(double z)
    {
        if (double.IsNaN(z))
        {
            throw new ArgumentOutOfRangeException(nameof(z), z, "Φ(z) needs a number.");
        }

        var y = Math.Abs(z);
        if (y <= 0.66291)
        {
            var ysq = y > 1.11e-16 ? y * y : 0;
            var xnum = 0.065682337918207449113 * ysq;
            var xden = ysq;
            xnum = (xnum + 2.2352520354606839287) * ysq;
            xden = (xden + 47.20258190468824187) * ysq;
            xnum = (xnum + 161.02823106855587881) * ysq;
            xden = (xden + 976.09855173777669322) * ysq;
            xnum = (xnum + 1067.6894854603709582) * ysq;
            xden = (xden + 10260.932208618978205) * ysq;
            return 0.5 - (y * (xnum + 18154.981253343561249) / (xden + 45507.789335026729956));
        }

        double ratio;
        if (y <= 5.656854249492380195206754896838)
        {
            var xnum = 1.0765576773720192317e-8 * y;
            var xden = y;
            xnum = (xnum + 0.39894151208813466764) * y;
            xden = (xden + 22.266688044328115691) * y;
            xnum = (xnum + 8.8831497943883759412) * y;
            xden = (xden + 235.38790178262499861) * y;
            xnum = (xnum + 93.506656132177855979) * y;
            xden = (xden + 1519.377599407554805) * y;
            xnum = (xnum + 597.27027639480026226) * y;
            xden = (xden + 6485.558298266760755) * y;
            xnum = (xnum + 2494.5375852903726711) * y;
            xden = (xden + 18615.571640885098091) * y;
            xnum = (xnum + 6848.1904505362823326) * y;
            xden = (xden + 34900.952721145977266) * y;
            xnum = (xnum + 11602.651437647350124) * y;
            xden = (xden + 38912.003286093271411) * y;
            ratio = (xnum + 9842.7148383839780218) / (xden + 19685.429676859990727);
        }
        else
        {
            if (double.IsPositiveInfinity(y))
            {
                return 0;
            }

            var inv = 1 / (y * y);
            var xnum = 0.02307344176494017303 * inv;
            var xden = inv;
            xnum = (xnum + 0.21589853405795699) * inv;
            xden = (xden + 1.28426009614491121) * inv;
            xnum = (xnum + 0.1274011611602473639) * inv;
            xden = (xden + 0.468238212480865118) * inv;
            xnum = (xnum + 0.022235277870649807) * inv;
            xden = (xden + 0.0659881378689285515) * inv;
            xnum = (xnum + 0.001421619193227893466) * inv;
            xden = (xden + 0.00378239633202758244) * inv;
            var term = inv * (xnum + 2.9112874951168792e-5) / (xden + 7.29751555083966205e-5);
            ratio = (InverseSqrtTwoPi - term) / y;
        }

        // exp(−y²/2) = exp(−r²/2)·exp(−(y − r)(y + r)/2) with r = y rounded down to 1/16 (r² is exact).
        var rounded = Math.Truncate(y * 16) / 16;
        var del = (y - rounded) * (y + rounded);
        return Math.Exp(-rounded * rounded * 0.5) * Math.Exp(-del * 0.5) * ratio;
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
