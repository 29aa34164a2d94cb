namespace LineTest.Core.Statistics;

/// <summary>
/// Sorts many doubles into ascending order with a least-significant-digit radix sort on their bit patterns (each
/// double mapped to an unsigned key of the same order: the sign bit flipped for positives, every bit for negatives),
/// six passes of 11 bits. A million values take about half the time of a comparison sort. Any NaN, or too few values
/// to gain from it, and <see cref="Array.Sort{T}(T[])"/> is used instead. −0 is placed before +0 (a comparison sort
/// leaves them in either order: they are equal).
/// </summary>
public static class DoubleSort
{
    private const int Bits = 11;
    private const int Buckets = 1 << Bits;
    private const int Passes = 6; // 6 × 11 = 66 ≥ 64 bits
    private const int Threshold = 4096;

    /// <summary>Sorts <paramref name="values"/> in place, ascending.</summary>
    public static void Ascending(double[] values)
    {
        ArgumentNullException.ThrowIfNull(values);
        var n = values.Length;
        if (n < Threshold)
        {
            Array.Sort(values);
            return;
        }

        foreach (var value in values)
        {
            if (double.IsNaN(value))
            {
                Array.Sort(values);
                return;
            }
        }

        // The keys are written over the values themselves (the same 8 bytes each), so one buffer is all that is added.
        var keys = System.Runtime.InteropServices.MemoryMarshal.Cast<double, ulong>(values.AsSpan());
        for (var i = 0; i < n; i++)
        {
            var bits = keys[i];
            keys[i] = (bits & 0x8000_0000_0000_0000UL) != 0 ? ~bits : bits | 0x8000_0000_0000_0000UL;
        }

        // All six histograms in one pass over the keys.
        var counts = new int[Passes * Buckets];
        foreach (var key in keys)
        {
            for (var p = 0; p < Passes; p++)
            {
                counts[(p * Buckets) + (int)((key >> (p * Bits)) & (Buckets - 1))]++;
            }
        }

        var buffer = new ulong[n];
        var fromKeys = true;
        for (var p = 0; p < Passes; p++)
        {
            var offset = p * Buckets;
            var shift = p * Bits;
            Span<ulong> from = fromKeys ? keys : buffer;
            Span<ulong> to = fromKeys ? buffer : keys;

            // A pass whose digit is the same for every key moves nothing.
            if (counts[offset + (int)((from[0] >> shift) & (Buckets - 1))] == n)
            {
                continue;
            }

            var sum = 0;
            for (var b = 0; b < Buckets; b++)
            {
                var c = counts[offset + b];
                counts[offset + b] = sum;
                sum += c;
            }

            foreach (var key in from)
            {
                to[counts[offset + (int)((key >> shift) & (Buckets - 1))]++] = key;
            }

            fromKeys = !fromKeys;
        }

        if (!fromKeys)
        {
            buffer.AsSpan().CopyTo(keys);
        }

        for (var i = 0; i < n; i++)
        {
            var key = keys[i];
            keys[i] = (key & 0x8000_0000_0000_0000UL) != 0 ? key & 0x7FFF_FFFF_FFFF_FFFFUL : ~key;
        }
    }
}
