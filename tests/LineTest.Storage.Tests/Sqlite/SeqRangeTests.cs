using LineTest.Storage.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SeqRangeTests
{
    [Theory]
    [InlineData(1, 10, 1)]
    [InlineData(1, 10, 3)]
    [InlineData(5, 1_000_004, 2)]
    [InlineData(7, 9, 8)]
    [InlineData(42, 42, 4)]
    public void Split_AnyParts_ConsecutiveNonEmptyRangesCoveringTheWhole(long first, long last, int parts)
    {
        var ranges = new SeqRange(first, last).Split(parts);

        Assert.Equal(Math.Min(parts, last - first + 1), ranges.Count);
        Assert.Equal(first, ranges[0].First);
        Assert.Equal(last, ranges[^1].Last);
        for (var i = 0; i < ranges.Count; i++)
        {
            Assert.True(ranges[i].Last >= ranges[i].First, $"range {i} is empty: {ranges[i]}");
            if (i > 0)
            {
                Assert.Equal(ranges[i - 1].Last + 1, ranges[i].First);
            }
        }

        var widths = ranges.Select(r => r.Last - r.First + 1).ToList();
        Assert.True(widths.Max() - widths.Min() <= 1, string.Join(", ", widths));
    }

    [Fact]
    public void Split_ZeroParts_Refused() =>
        Assert.Throws<ArgumentOutOfRangeException>(() => new SeqRange(1, 5).Split(0));
}
