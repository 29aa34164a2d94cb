namespace LineTest.Core.Statistics;

/// <summary>Student's t distribution with ν degrees of freedom.</summary>
public static class StudentTDistribution
{
    /// <summary>P(T ≤ t). Uses P(|T| &gt; |t|) = I_{ν/(ν + t²)}(ν/2, ½).</summary>
    public static double Cdf(double degreesOfFreedom, double t)
    {
        if (!(degreesOfFreedom > 0) || double.IsInfinity(degreesOfFreedom))
        {
            throw new ArgumentOutOfRangeException(nameof(degreesOfFreedom), degreesOfFreedom, "t needs finite degrees of freedom > 0.");
        }

        if (double.IsNaN(t))
        {
            throw new ArgumentOutOfRangeException(nameof(t), t, "t CDF needs a number.");
        }

        if (double.IsInfinity(t))
        {
            return t > 0 ? 1 : 0;
        }

        var twoSided = SpecialFunctions.BetaRegularized(degreesOfFreedom / 2, 0.5, degreesOfFreedom / (degreesOfFreedom + (t * t)));
        return t < 0 ? 0.5 * twoSided : 1 - (0.5 * twoSided);
    }
}
