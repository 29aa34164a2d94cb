namespace LineTest.Storage.Sqlite;

/// <summary>An inclusive range of run <c>seq</c> numbers (insertion order).</summary>
/// <param name="First">Lowest seq.</param>
/// <param name="Last">Highest seq (inclusive).</param>
public readonly record struct SeqRange(long First, long Last)
{
    /// <summary>Cuts the range into at most <paramref name="parts"/> consecutive, non-empty ranges of near-equal width.</summary>
    public IReadOnlyList<SeqRange> Split(int parts)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(parts, 1);
        var width = Last - First + 1;
        var count = (int)Math.Min(parts, Math.Max(1, width));
        var ranges = new SeqRange[count];
        var start = First;
        for (var i = 0; i < count; i++)
        {
            // Spread the remainder over the first ranges so widths differ by at most one.
            var size = (width / count) + (i < width % count ? 1 : 0);
            ranges[i] = new SeqRange(start, start + size - 1);
            start += size;
        }

        return ranges;
    }
}
