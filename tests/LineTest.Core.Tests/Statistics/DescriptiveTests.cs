using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class DescriptiveTests
{
    [Fact]
    public void MeanAndStandardDeviation_HandExample_Match()
    {
        // 2, 4, 4, 4, 5, 5, 7, 9: mean 5, Σ(x − 5)² = 32, s = √(32/7) [hand-computed].
        double[] values = [2, 4, 4, 4, 5, 5, 7, 9];
        Assert.Equal(5.0, Descriptive.Mean(values), 1e-15);
        Assert.Equal(Math.Sqrt(32.0 / 7), Descriptive.StandardDeviation(values), 1e-14);
    }

    [Fact]
    public void StandardDeviation_LargeOffset_DoesNotCancel()
    {
        // Same spread as the example above, shifted by 1e9: two passes keep every digit of s.
        double[] values = [1e9 + 2, 1e9 + 4, 1e9 + 4, 1e9 + 4, 1e9 + 5, 1e9 + 5, 1e9 + 7, 1e9 + 9];
        Assert.Equal(Math.Sqrt(32.0 / 7), Descriptive.StandardDeviation(values), 1e-9);
    }

    [Fact]
    public void AverageMovingRange_HandExample_Matches()
    {
        // |3 − 1| + |2 − 3| + |6 − 2| = 7 over 3 ranges [hand-computed].
        Assert.Equal(7.0 / 3, Descriptive.AverageMovingRange([1, 3, 2, 6]), 1e-15);
    }

    [Fact]
    public void Mean_NaNValue_ThrowsNamingIndex()
    {
        var ex = Assert.Throws<ArgumentException>(() => Descriptive.Mean([1, 2, double.NaN]));
        Assert.Contains("values[2]", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void StandardDeviation_OneValue_Throws()
    {
        Assert.Throws<ArgumentException>(() => Descriptive.StandardDeviation([1.0]));
    }
}
