namespace LineTest.Core.Statistics;

/// <summary>
/// Process capability of one measurement (NIST/SEMATECH e-Handbook of Statistical Methods §6.1.6):
/// Cp, Cpk, Pp, Ppk with confidence bounds, and observed and expected out-of-specification ppm.
/// </summary>
public static class Capability
{
    /// <summary>
    /// d2 for a moving range of span 2 (ASTM E2587 table, n = 2), turning MR̄ into the within σ.
    /// </summary>
    public const double MovingRangeD2 = 1.128;

    private const double PartsPerMillion = 1e6;

    /// <summary>
    /// Computes capability from values in run order (the order matters for the within σ).
    /// </summary>
    /// <param name="values">Readings in the order they were taken; all finite.</param>
    /// <param name="limits">Specification limits; one may be absent.</param>
    /// <param name="confidenceLevel">Two-sided confidence level of the bounds, 0 &lt; level &lt; 1 (usually 0.95).</param>
    /// <returns>The result; indices that cannot be defined are null and <see cref="CapabilityResult.Notes"/> says why.</returns>
    public static CapabilityResult Analyze(ReadOnlySpan<double> values, SpecLimits limits, double confidenceLevel = 0.95)
    {
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "The confidence level must lie strictly between 0 and 1, e.g. 0.95.");
        }

        var notes = new List<string>();
        var n = values.Length;
        if (!limits.Lower.HasValue && !limits.Upper.HasValue)
        {
            notes.Add("No specification limits: capability indices and ppm out of specification are not defined.");
        }
        else if (!limits.IsTwoSided)
        {
            notes.Add("One-sided specification: Cp and Pp need both limits and are not defined.");
        }

        if (n == 0)
        {
            notes.Add("No values.");
            return new CapabilityResult { Limits = limits, ConfidenceLevel = confidenceLevel, Count = 0, Notes = notes };
        }

        var mean = Descriptive.Mean(values);
        var (observedBelow, observedAbove, observedTotal) = ObservedPpm(values, limits);
        var result = new CapabilityResult
        {
            Limits = limits,
            ConfidenceLevel = confidenceLevel,
            Count = n,
            Mean = mean,
            ObservedPpmBelow = observedBelow,
            ObservedPpmAbove = observedAbove,
            ObservedPpmTotal = observedTotal,
        };

        if (n < 2)
        {
            notes.Add("Only 1 value: a standard deviation needs at least 2, so no index is defined.");
            return result with { Notes = notes };
        }

        var sigmaOverall = Descriptive.StandardDeviation(values, mean);
        var averageMovingRange = Descriptive.AverageMovingRange(values);
        var sigmaWithin = averageMovingRange / MovingRangeD2;
        result = result with { StdDevOverall = sigmaOverall, AverageMovingRange = averageMovingRange, StdDevWithin = sigmaWithin };

        if (!limits.Lower.HasValue && !limits.Upper.HasValue)
        {
            return result with { Notes = notes };
        }

        var z = NormalDistribution.Quantile(0.5 + (confidenceLevel / 2));
        if (sigmaWithin > 0)
        {
            // The within σ comes from moving ranges, which carry less information than n − 1 squared deviations:
            // its bounds use the effective degrees of freedom of MR̄/d2, not n − 1.
            var within = Indices(mean, sigmaWithin, limits);
            var nu = MovingRangeDegreesOfFreedom(n);
            result = result with
            {
                Cp = within.Spread,
                Cpu = within.Upper,
                Cpl = within.Lower,
                Cpk = within.Worst,
                WithinDegreesOfFreedom = nu,
                CpInterval = SpreadInterval(within.Spread, nu, confidenceLevel),
                CpkInterval = BissellInterval(within.Worst, n, nu, z, confidenceLevel),
            };
        }
        else
        {
            notes.Add("Within σ is zero (no moving range: all values equal): Cp, Cpu, Cpl and Cpk are not defined.");
        }

        if (sigmaOverall > 0)
        {
            var overall = Indices(mean, sigmaOverall, limits);
            double? below = limits.Lower is { } lsl ? PartsPerMillion * NormalDistribution.Cdf((lsl - mean) / sigmaOverall) : null;
            double? above = limits.Upper is { } usl ? PartsPerMillion * NormalDistribution.UpperTail((usl - mean) / sigmaOverall) : null;
            result = result with
            {
                Pp = overall.Spread,
                Ppu = overall.Upper,
                Ppl = overall.Lower,
                Ppk = overall.Worst,
                PpInterval = SpreadInterval(overall.Spread, n - 1, confidenceLevel),
                PpkInterval = BissellInterval(overall.Worst, n, n - 1, z, confidenceLevel),
                ExpectedPpmBelow = below,
                ExpectedPpmAbove = above,
                ExpectedPpmTotal = (below ?? 0) + (above ?? 0),
            };
        }
        else
        {
            notes.Add("Overall σ is zero (all values equal): Pp, Ppu, Ppl, Ppk and expected ppm are not defined.");
        }

        return result with { Notes = notes };
    }

    /// <summary>
    /// Bissell (1990, Applied Statistics 39) interval: Ĉpk ± z·√(1/(9n) + Ĉpk²/(2(n − 1))), z = Φ⁻¹(1 − α/2).
    /// </summary>
    public static ConfidenceInterval BissellInterval(double cpk, int count, double confidenceLevel)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 2);
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "The confidence level must lie strictly between 0 and 1.");
        }

        return BissellInterval(cpk, count, count - 1, NormalDistribution.Quantile(0.5 + (confidenceLevel / 2)), confidenceLevel)!.Value;
    }

    /// <summary>
    /// Chi-square interval on Cp (or Pp): Ĉp·√(χ²(α/2, n − 1)/(n − 1)) … Ĉp·√(χ²(1 − α/2, n − 1)/(n − 1)).
    /// </summary>
    public static ConfidenceInterval SpreadInterval(double cp, int count, double confidenceLevel)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 2);
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "The confidence level must lie strictly between 0 and 1.");
        }

        return SpreadInterval((double?)cp, count - 1, confidenceLevel)!.Value;
    }

    /// <summary>
    /// Effective degrees of freedom ν of the within σ̂ = MR̄/d2 from <paramref name="count"/> independent normal values,
    /// so that σ̂²·ν/σ² is treated as χ²(ν), as s²·(n − 1)/σ² is for the sample σ.
    /// </summary>
    /// <remarks>
    /// Derived from the exact variance of MR̄: each moving range |xᵢ − xᵢ₋₁| is σ√2·|Z|, so Var(MRᵢ) = σ²(2 − 4/π);
    /// neighbouring ranges share a value, their differences correlate with ρ = −½, and for a bivariate normal
    /// Cov(|U|, |V|) = (2σᵤσᵥ/π)(ρ·asin ρ + √(1 − ρ²) − 1), which gives Cov(MRᵢ, MRᵢ₊₁) = (4σ²/π)(π/12 + √3/2 − 1);
    /// ranges further apart are independent. With m = n − 1 ranges,
    /// Var(MR̄) = [m·Var(MRᵢ) + 2(m − 1)·Cov]/m², and ν = 1/(2·Var(σ̂)/σ²) by matching the variance of a scaled
    /// χ (Var(s)/σ² ≈ 1/(2ν)). For large n, ν ≈ 0.605(n − 1), close to the 0.62(n − 1) Cryer &amp; Ryan (1990,
    /// Journal of Quality Technology 22) give for MR̄/d2 [from memory]; well below the n − 1 of the sample σ.
    /// </remarks>
    public static double MovingRangeDegreesOfFreedom(int count)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 2);
        double m = count - 1;
        var variance = 2 - (4 / Math.PI);
        var covariance = 4 / Math.PI * ((Math.PI / 12) + (Math.Sqrt(3) / 2) - 1);
        var meanVariance = ((m * variance) + (2 * (m - 1) * covariance)) / (m * m);

        // d2 = E|xᵢ − xᵢ₋₁|/σ = 2/√π exactly (the tabled 1.128 rounded).
        var relativeVariance = meanVariance / (4 / Math.PI);
        return 1 / (2 * relativeVariance);
    }

    private static ConfidenceInterval? BissellInterval(double? cpk, int n, double nu, double z, double level)
    {
        if (cpk is not { } c)
        {
            return null;
        }

        // Bissell: Var(Ĉpk) ≈ 1/(9n) + Cpk²/(2ν); the first term comes from the mean (n values), the second from σ̂ with
        // ν degrees of freedom (n − 1 for the sample σ, the effective ν for a moving-range σ).
        var halfWidth = z * Math.Sqrt((1.0 / (9.0 * n)) + (c * c / (2.0 * nu)));
        return new ConfidenceInterval(c - halfWidth, c + halfWidth, level);
    }

    private static ConfidenceInterval? SpreadInterval(double? cp, double df, double level)
    {
        if (cp is not { } c)
        {
            return null;
        }

        var alpha = 1 - level;
        var lower = c * Math.Sqrt(ChiSquareDistribution.Quantile(df, alpha / 2) / df);
        var upper = c * Math.Sqrt(ChiSquareDistribution.Quantile(df, 1 - (alpha / 2)) / df);
        return new ConfidenceInterval(lower, upper, level);
    }

    private static (double? Spread, double? Upper, double? Lower, double? Worst) Indices(double mean, double sigma, SpecLimits limits)
    {
        double? spread = limits is { Lower: { } l, Upper: { } u } ? (u - l) / (6 * sigma) : null;
        double? upper = limits.Upper is { } usl ? (usl - mean) / (3 * sigma) : null;
        double? lower = limits.Lower is { } lsl ? (mean - lsl) / (3 * sigma) : null;
        double? worst = (upper, lower) switch
        {
            ({ } a, { } b) => Math.Min(a, b),
            ({ } a, null) => a,
            (null, { } b) => b,
            _ => null,
        };
        return (spread, upper, lower, worst);
    }

    // A value exactly on a limit is inside the specification, as a reading's verdict treats it.
    private static (double? Below, double? Above, double? Total) ObservedPpm(ReadOnlySpan<double> values, SpecLimits limits)
    {
        var lsl = limits.Lower ?? double.NegativeInfinity;
        var usl = limits.Upper ?? double.PositiveInfinity;
        var below = 0;
        var above = 0;
        foreach (var v in values)
        {
            if (v < lsl)
            {
                below++;
            }
            else if (v > usl)
            {
                above++;
            }
        }

        double n = values.Length;
        return (
            limits.Lower.HasValue ? PartsPerMillion * below / n : null,
            limits.Upper.HasValue ? PartsPerMillion * above / n : null,
            limits.Lower.HasValue || limits.Upper.HasValue ? PartsPerMillion * (below + above) / n : null);
    }
}
