using LineTest.Core.Statistics;

namespace LineTest.Core.Decisions;

/// <summary>
/// The coverage factor for an expanded uncertainty of about 95 %: k = t_p(ν_eff), the two-sided Student t quantile for
/// p = 95.45 % at the effective degrees of freedom (JCGM 100:2008 G.3.2, G.4, table G.2: t = 2.00 for ν = ∞, 2.32 for
/// ν = 9, 2.87 for ν = 4 [published]).
/// </summary>
public static class CoverageFactor
{
    /// <summary>The level of confidence of k = 2 for a normal distribution, 95.45 % (JCGM 100:2008 G.1.3).</summary>
    public const double Level = 0.9545;

    /// <summary>k for ν_eff = <paramref name="effectiveDegreesOfFreedom"/> (null or above 10⁶: infinite, k = 2).</summary>
    public static double ForDegreesOfFreedom(double? effectiveDegreesOfFreedom)
    {
        if (effectiveDegreesOfFreedom is not { } nu || nu > 1e6)
        {
            return 2.0;
        }

        if (!(nu >= 1) || double.IsNaN(nu))
        {
            throw new ArgumentOutOfRangeException(nameof(effectiveDegreesOfFreedom), effectiveDegreesOfFreedom, "A coverage factor needs at least one degree of freedom.");
        }

        // Bisection on the t CDF: P(T ≤ k) = (1 + p)/2. k lies between the normal value and 14 (ν = 1 gives 13.97).
        var target = (1 + Level) / 2;
        double low = 1.9, high = 14.5;
        for (var i = 0; i < 100; i++)
        {
            var mid = 0.5 * (low + high);
            if (StudentTDistribution.Cdf(nu, mid) < target)
            {
                low = mid;
            }
            else
            {
                high = mid;
            }
        }

        return 0.5 * (low + high);
    }
}
