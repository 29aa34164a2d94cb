using System.Runtime.CompilerServices;

namespace LineTest.Core.Statistics;

/// <summary>
/// Basic sample statistics over spans, without allocation. Every function takes any finite values, up to
/// ±<see cref="double.MaxValue"/>: a sum or a square that would overflow is computed on scaled values instead, so a
/// reading of 1e160 gives its true mean and σ rather than infinity.
/// </summary>
public static class Descriptive
{
    /// <summary>Arithmetic mean. Throws on an empty span or a non-finite value (naming its index).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double Mean(ReadOnlySpan<double> values)
    {
        if (values.IsEmpty)
        {
            throw new ArgumentException("The mean of no values is undefined.", nameof(values));
        }

        double sum = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var v = values[i];
            if (!double.IsFinite(v))
            {
                throw new ArgumentException($"values[{i}] is {v}; remove missing or non-finite readings before computing statistics.", nameof(values));
            }

            sum += v;
        }

        if (double.IsFinite(sum))
        {
            return sum / values.Length;
        }

        // The plain sum overflowed (values near ±1.8e308): each value divided by n first cannot.
        double scaled = 0;
        double n = values.Length;
        foreach (var v in values)
        {
            scaled += v / n;
        }

        return scaled;
    }

    /// <summary>
    /// Sample standard deviation with n − 1 in the denominator, by two passes (mean first, then squared
    /// deviations) so large offsets such as 300 K ± 0.01 K do not cancel. Needs at least two values.
    /// </summary>
    public static double StandardDeviation(ReadOnlySpan<double> values)
    {
        if (values.Length < 2)
        {
            throw new ArgumentException($"A sample standard deviation needs at least 2 values; got {values.Length}.", nameof(values));
        }

        return StandardDeviation(values, Mean(values));
    }

    /// <summary>
    /// Average moving range of span 2, |x[i] − x[i−1]| averaged over i = 1…n−1, in the given (run) order.
    /// Needs at least two values.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double AverageMovingRange(ReadOnlySpan<double> values)
    {
        if (values.Length < 2)
        {
            throw new ArgumentException($"A moving range needs at least 2 values; got {values.Length}.", nameof(values));
        }

        double sum = 0;
        for (var i = 1; i < values.Length; i++)
        {
            if (!double.IsFinite(values[i]) || !double.IsFinite(values[i - 1]))
            {
                throw new ArgumentException("values holds a non-finite reading; remove it before computing a moving range.", nameof(values));
            }

            sum += Math.Abs(values[i] - values[i - 1]);
        }

        if (double.IsFinite(sum))
        {
            return sum / (values.Length - 1);
        }

        // A difference or the sum overflowed: halve every value (exact in binary) and average the scaled ranges.
        double scaled = 0;
        double m = values.Length - 1;
        for (var i = 1; i < values.Length; i++)
        {
            scaled += Math.Abs((values[i] / 2) - (values[i - 1] / 2)) / m;
        }

        return 2 * scaled;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double StandardDeviation(ReadOnlySpan<double> values, double mean)
    {
        double sum = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var d = values[i] - mean;
            sum += d * d;
        }

        if (double.IsFinite(sum))
        {
            return Math.Sqrt(sum / (values.Length - 1));
        }

        // A square overflowed (deviations beyond about 1e154): scale the deviations by the largest one.
        double largest = 0;
        foreach (var v in values)
        {
            largest = Math.Max(largest, Math.Abs((v / 2) - (mean / 2)));
        }

        double scaled = 0;
        foreach (var v in values)
        {
            var d = ((v / 2) - (mean / 2)) / largest;
            scaled += d * d;
        }

        return 2 * largest * Math.Sqrt(scaled / (values.Length - 1));
    }
}
