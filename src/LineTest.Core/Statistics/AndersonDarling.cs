using System.Runtime.CompilerServices;

namespace LineTest.Core.Statistics;

/// <summary>
/// Anderson–Darling normality test with estimated mean and σ, per D'Agostino &amp; Stephens (1986).
/// </summary>
public static class AndersonDarling
{
    /// <summary>Fewest values accepted. With fewer the statistic says nothing useful about the shape.</summary>
    public const int MinimumCount = 3;

    /// <summary>
    /// Tests whether the values look normal. O(n log n) for the sort; the input is not modified.
    /// </summary>
    public static StatisticOutcome<AndersonDarlingResult> Test(ReadOnlySpan<double> values)
    {
        if (values.Length < MinimumCount)
        {
            return Test(values, []);
        }

        var sorted = values.ToArray();
        DoubleSort.Ascending(sorted);
        return Test(values, sorted);
    }

    /// <summary>
    /// Tests whether the values look normal, with the values already sorted by the caller (so one sort serves this test
    /// and the percentiles). The mean and σ are taken from <paramref name="values"/> in their own order, so the result
    /// is exactly that of <see cref="Test(ReadOnlySpan{double})"/>.
    /// </summary>
    /// <param name="values">The values, in any order (the order of the report: run order).</param>
    /// <param name="sorted">The same values in ascending order.</param>
    /// <exception cref="ArgumentException">The two spans differ in length, or <paramref name="sorted"/> is not ascending.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static StatisticOutcome<AndersonDarlingResult> Test(ReadOnlySpan<double> values, ReadOnlySpan<double> sorted)
    {
        var n = values.Length;
        if (n < MinimumCount)
        {
            return StatisticOutcome<AndersonDarlingResult>.NotComputed(
                $"The normality test needs at least {MinimumCount} values; got {n}.");
        }

        if (sorted.Length != n)
        {
            throw new ArgumentException($"sorted has {sorted.Length} values but values has {n}; pass the same values sorted.", nameof(sorted));
        }

        var mean = Descriptive.Mean(values);
        var sigma = Descriptive.StandardDeviation(values, mean);
        if (!(sigma > 0))
        {
            return StatisticOutcome<AndersonDarlingResult>.NotComputed("All values are equal: normality cannot be judged.");
        }

        for (var i = 1; i < n; i++)
        {
            if (!(sorted[i - 1] <= sorted[i]))
            {
                throw new ArgumentException($"sorted[{i - 1}] = {sorted[i - 1]} is above sorted[{i}] = {sorted[i]}; pass the values in ascending order.", nameof(sorted));
            }
        }

        // A² = −n − (1/n)·Σ (2i − 1)·[ln Φ(z_i) + ln(1 − Φ(z_{n+1−i}))], regrouped so each z is used once:
        // value i (1-based) contributes (2i − 1)·ln Φ(z_i) + (2(n − i) + 1)·ln(1 − Φ(z_i)).
        // Only the smaller tail is computed; the other is 1 minus it, which loses nothing since the tail ≤ ½.
        double sum = 0;
        for (var i = 0; i < n; i++)
        {
            var z = (sorted[i] - mean) / sigma;
            var rank = i + 1;
            var tail = NormalDistribution.SmallerTail(z);
            var lower = z < 0 ? tail : 1.0 - tail;
            var upper = z < 0 ? 1.0 - tail : tail;
            sum += ((2.0 * rank) - 1) * Math.Log(lower);
            sum += ((2.0 * (n - rank)) + 1) * Math.Log(upper);
        }

        var aSquared = -n - (sum / n);
        var aStar = Adjust(aSquared, n);
        return StatisticOutcome<AndersonDarlingResult>.Computed(new AndersonDarlingResult(n, aSquared, aStar, PValue(aStar)));
    }

    /// <summary>A*² = A²·(1 + 0.75/n + 2.25/n²) (D'Agostino &amp; Stephens 1986, case 3).</summary>
    public static double Adjust(double aSquared, int count)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        double n = count;
        return aSquared * (1 + (0.75 / n) + (2.25 / (n * n)));
    }

    /// <summary>
    /// p-value for A*² by the piecewise formulas of D'Agostino &amp; Stephens (1986), Table 4.9, case 3
    /// (breaks at 0.2, 0.34 and 0.6).
    /// </summary>
    /// <remarks>
    /// The last piece exp(1.2937 − 5.709·A + 0.0186·A²) turns upward past its minimum at A ≈ 153.5, far beyond
    /// any table; A*² is held there so the p-value never rises as the fit gets worse.
    /// </remarks>
    public static double PValue(double aStarSquared)
    {
        if (double.IsNaN(aStarSquared) || aStarSquared < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(aStarSquared), aStarSquared, "A*² is a non-negative number.");
        }

        var a = aStarSquared;
        double p;
        if (a < 0.2)
        {
            p = 1 - Math.Exp(-13.436 + (101.14 * a) - (223.73 * a * a));
        }
        else if (a < 0.34)
        {
            p = 1 - Math.Exp(-8.318 + (42.796 * a) - (59.938 * a * a));
        }
        else if (a < 0.6)
        {
            p = Math.Exp(0.9177 - (4.279 * a) - (1.38 * a * a));
        }
        else
        {
            const double turningPoint = 5.709 / (2 * 0.0186);
            a = Math.Min(a, turningPoint);
            p = Math.Exp(1.2937 - (5.709 * a) + (0.0186 * a * a));
        }

        return Math.Clamp(p, 0, 1);
    }
}
