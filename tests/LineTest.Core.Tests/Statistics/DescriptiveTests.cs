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

    [Fact]
    public void StandardDeviation_ReadingOf1e160_IsFiniteAndExact()
    {
        // Regression: a reading of 1e160 made every report format crash (its square overflows to infinity).
        // 1e160·{1, 2, 3}: mean 2e160, sample σ 1e160 [derived].
        double[] values = [1e160, 2e160, 3e160];
        Assert.Equal(2e160, Descriptive.Mean(values), 1e146);
        Assert.Equal(1e160, Descriptive.StandardDeviation(values), 1e146);
        Assert.Equal(1e160, Descriptive.AverageMovingRange(values), 1e146);
    }

    [Fact]
    public void MeanAndMovingRange_ValuesNearDoubleMax_DoNotOverflow()
    {
        // Moving ranges of 1.6e308 each: their sum overflows, their mean does not.
        double[] values = [8e307, -8e307, 8e307];
        Assert.Equal(8e307 / 3, Descriptive.Mean(values), 1e294);
        Assert.Equal(1.6e308, Descriptive.AverageMovingRange(values), 1e295);
        Assert.Equal(1.7e308, Descriptive.Mean([1.7e308, 1.7e308]), 1e295);
        Assert.True(double.IsFinite(Descriptive.StandardDeviation([1e300, -1e300, 5e299])));
    }
}
