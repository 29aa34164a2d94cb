namespace LineTest.Core.Statistics;

/// <summary>Basic sample statistics over spans, without allocation.</summary>
public static class Descriptive
{
    /// <summary>Arithmetic mean. Throws on an empty span or a non-finite value (naming its index).</summary>
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

        return sum / values.Length;
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
    public static double AverageMovingRange(ReadOnlySpan<double> values)
    {
        if (values.Length < 2)
        {
            throw new ArgumentException($"A moving range needs at least 2 values; got {values.Length}.", nameof(values));
        }

        double sum = 0;
        for (var i = 1; i < values.Length; i++)
        {
            sum += Math.Abs(values[i] - values[i - 1]);
        }

        if (!double.IsFinite(sum))
        {
            throw new ArgumentException("values holds a non-finite reading; remove it before computing a moving range.", nameof(values));
        }

        return sum / (values.Length - 1);
    }

    internal static double StandardDeviation(ReadOnlySpan<double> values, double mean)
    {
        double sum = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var d = values[i] - mean;
            sum += d * d;
        }

        return Math.Sqrt(sum / (values.Length - 1));
    }
}
