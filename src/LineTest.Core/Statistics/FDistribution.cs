namespace LineTest.Core.Statistics;

/// <summary>The F (Fisher–Snedecor) distribution with d1 and d2 degrees of freedom.</summary>
public static class FDistribution
{
    /// <summary>P(F ≤ x) = I_{d1·x/(d1·x + d2)}(d1/2, d2/2).</summary>
    public static double Cdf(double d1, double d2, double x)
    {
        Check(d1, d2, x);
        if (x <= 0)
        {
            return 0;
        }

        if (double.IsPositiveInfinity(x))
        {
            return 1;
        }

        return SpecialFunctions.BetaRegularized(d1 / 2, d2 / 2, d1 * x / ((d1 * x) + d2));
    }

    /// <summary>P(F &gt; x) = I_{d2/(d2 + d1·x)}(d2/2, d1/2): the ANOVA p-value, accurate when small.</summary>
    public static double UpperTail(double d1, double d2, double x)
    {
        Check(d1, d2, x);
        if (x <= 0)
        {
            return 1;
        }

        if (double.IsPositiveInfinity(x))
        {
            return 0;
        }

        return SpecialFunctions.BetaRegularized(d2 / 2, d1 / 2, d2 / (d2 + (d1 * x)));
    }

    private static void Check(double d1, double d2, double x)
    {
        if (!(d1 > 0) || !(d2 > 0) || double.IsInfinity(d1) || double.IsInfinity(d2))
        {
            throw new ArgumentOutOfRangeException(nameof(d1), $"F needs finite degrees of freedom > 0; got d1 = {d1}, d2 = {d2}.");
        }

        if (double.IsNaN(x))
        {
            throw new ArgumentOutOfRangeException(nameof(x), x, "F CDF needs a number.");
        }
    }
}
