using System.Runtime.CompilerServices;

namespace LineTest.Core.Statistics;

/// <summary>
/// Percentile-based capability (ISO 22514-2's percentile method [from memory]) with the sample quantiles of
/// Hyndman &amp; Fan (1996) definition 7 (linear interpolation between order statistics, as R's default and
/// spreadsheet PERCENTILE.INC compute them).
/// </summary>
public static class PercentileCapability
{
    /// <summary>The lower percentile, the share of a normal below μ − 3σ (Φ(−3) = 0.00135).</summary>
    public const double LowerFraction = 0.00135;

    /// <summary>The upper percentile, 1 − <see cref="LowerFraction"/>.</summary>
    public const double UpperFraction = 0.99865;

    /// <summary>Fewest values accepted.</summary>
    public const int MinimumCount = 3;

    /// <summary>Computes the percentile indices; not computed without limits, with too few values or no spread.</summary>
    public static StatisticOutcome<PercentileCapabilityResult> Analyze(ReadOnlySpan<double> values, SpecLimits limits)
    {
        if ((!limits.Lower.HasValue && !limits.Upper.HasValue) || values.Length < MinimumCount)
        {
            // Not computed either way, before any order is asked for: nothing to copy or sort.
            return AnalyzeSorted(values, limits);
        }

        var sorted = values.ToArray();
        foreach (var v in sorted)
        {
            if (!double.IsFinite(v))
            {
                throw new ArgumentException("values holds a non-finite reading; remove it first.", nameof(values));
            }
        }

        DoubleSort.Ascending(sorted);
        return AnalyzeSorted(sorted, limits);
    }

    /// <summary>
    /// As <see cref="Analyze"/>, for values the caller has already sorted ascending (so one sort serves the percentiles
    /// and the normality test).
    /// </summary>
    /// <exception cref="ArgumentException">A value is not finite, or <paramref name="sorted"/> is not ascending.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static StatisticOutcome<PercentileCapabilityResult> AnalyzeSorted(ReadOnlySpan<double> sorted, SpecLimits limits)
    {
        if (!limits.Lower.HasValue && !limits.Upper.HasValue)
        {
            return StatisticOutcome<PercentileCapabilityResult>.NotComputed("No specification limits: percentile capability is not defined.");
        }

        if (sorted.Length < MinimumCount)
        {
            return StatisticOutcome<PercentileCapabilityResult>.NotComputed(
                $"Percentile capability needs at least {MinimumCount} values; got {sorted.Length}.");
        }

        for (var i = 0; i < sorted.Length; i++)
        {
            if (!double.IsFinite(sorted[i]))
            {
                throw new ArgumentException($"sorted[{i}] is {sorted[i]}; remove missing or non-finite readings first.", nameof(sorted));
            }

            if (i > 0 && sorted[i - 1] > sorted[i])
            {
                throw new ArgumentException($"sorted[{i - 1}] = {sorted[i - 1]} is above sorted[{i}] = {sorted[i]}; pass the values in ascending order.", nameof(sorted));
            }
        }

        var low = Quantile(sorted, LowerFraction);
        var median = Quantile(sorted, 0.5);
        var high = Quantile(sorted, UpperFraction);
        double? ppu = limits.Upper is { } usl && high > median ? (usl - median) / (high - median) : null;
        double? ppl = limits.Lower is { } lsl && median > low ? (median - lsl) / (median - low) : null;
        double? pp = limits is { Lower: { } l, Upper: { } u } && high > low ? (u - l) / (high - low) : null;
        if (pp is null && ppu is null && ppl is null)
        {
            return StatisticOutcome<PercentileCapabilityResult>.NotComputed(
                "The values have no spread at the percentiles used: percentile capability is not defined.");
        }

        double? ppk = (ppu, ppl) switch
        {
            ({ } a, { } b) => Math.Min(a, b),
            ({ } a, null) => limits.Lower.HasValue ? null : a,
            (null, { } b) => limits.Upper.HasValue ? null : b,
            _ => null,
        };
        return StatisticOutcome<PercentileCapabilityResult>.Computed(
            new PercentileCapabilityResult(sorted.Length, low, median, high, pp, ppu, ppl, ppk, sorted.Length < 1 / LowerFraction));
    }

    /// <summary>
    /// Sample quantile of ascending <paramref name="sorted"/> values by Hyndman &amp; Fan definition 7:
    /// h = (n − 1)p, x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋ + 1] − x[⌊h⌋]) (0-based).
    /// </summary>
    public static double Quantile(ReadOnlySpan<double> sorted, double p)
    {
        if (sorted.IsEmpty)
        {
            throw new ArgumentException("A quantile of no values is undefined.", nameof(sorted));
        }

        if (!(p >= 0 && p <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, "p must lie between 0 and 1.");
        }

        var h = (sorted.Length - 1) * p;
        var below = (int)Math.Floor(h);
        if (below >= sorted.Length - 1)
        {
            return sorted[^1];
        }

        var fraction = h - below;
        // Written as a weighted mean so two huge values of opposite sign cannot overflow their difference.
        return ((1 - fraction) * sorted[below]) + (fraction * sorted[below + 1]);
    }
}
