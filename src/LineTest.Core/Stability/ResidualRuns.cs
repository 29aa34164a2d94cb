namespace LineTest.Core.Stability;

/// <summary>
/// The Wald–Wolfowitz runs test on the signs of residuals (Wald &amp; Wolfowitz 1940; NIST/SEMATECH e-Handbook of
/// Statistical Methods §1.3.5.13): with n₁ positive and n₂ negative residuals and N = n₁ + n₂, the number of runs R has
/// mean 2n₁n₂/N + 1 and variance 2n₁n₂(2n₁n₂ − N)/(N²(N − 1)) under randomness. Few runs (a strongly negative z) mean
/// the residuals have a shape: the model misses something, such as a step.
/// </summary>
public static class ResidualRuns
{
    /// <summary>Runs test on <paramref name="residuals"/>, ignoring those within ±<paramref name="zeroTolerance"/>.</summary>
    /// <returns>The runs counted and the z-score (0 when one sign is missing or too few residuals).</returns>
    public static (int Runs, double ZScore) Test(IReadOnlyList<double> residuals, double zeroTolerance)
    {
        ArgumentNullException.ThrowIfNull(residuals);
        ArgumentOutOfRangeException.ThrowIfNegative(zeroTolerance);
        int positives = 0, negatives = 0, runs = 0, previous = 0;
        foreach (var r in residuals)
        {
            var sign = r > zeroTolerance ? 1 : r < -zeroTolerance ? -1 : 0;
            if (sign == 0)
            {
                continue;
            }

            if (sign > 0)
            {
                positives++;
            }
            else
            {
                negatives++;
            }

            if (sign != previous)
            {
                runs++;
                previous = sign;
            }
        }

        double n1 = positives, n2 = negatives, n = n1 + n2;
        if (positives == 0 || negatives == 0 || n < 3)
        {
            return (runs, 0);
        }

        var mean = (2 * n1 * n2 / n) + 1;
        var variance = 2 * n1 * n2 * ((2 * n1 * n2) - n) / (n * n * (n - 1));
        return variance > 0 ? (runs, (runs - mean) / Math.Sqrt(variance)) : (runs, 0);
    }
}
