using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ESeriesTests
{
    [Fact]
    public void E24_Mantissas_AreThePublishedTable()
    {
        // IEC 60063:2015, E24 [published].
        double[] expected =
        [
            1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
            3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
        ];

        Assert.Equal(expected, ESeries.E24.Mantissas);
    }

    [Theory]
    [InlineData(10, 2.7, 2.6)]
    [InlineData(11, 3.0, 2.9)]
    [InlineData(12, 3.3, 3.2)]
    [InlineData(13, 3.6, 3.5)]
    [InlineData(14, 3.9, 3.8)]
    [InlineData(15, 4.3, 4.2)]
    [InlineData(16, 4.7, 4.6)]
    [InlineData(22, 8.2, 8.3)]
    public void E24_EightExceptions_TakeTheTableNotTheFormula(int index, double table, double formula)
    {
        // IEC 60063:2015 [published]: these eight E24 values differ from round(10^(i/24), 1).
        Assert.Equal(formula, Math.Round(Math.Pow(10, index / 24.0), 1));
        Assert.Equal(table, ESeries.E24.Mantissas[index]);
    }

    [Fact]
    public void E96_IsTheRoundedFormulaWithNoException()
    {
        // IEC 60063:2015 [published]: E96 = round(10^(i/96), 2), i = 0…95; first and last values 1.00 … 9.76.
        Assert.Equal(96, ESeries.E96.Mantissas.Count);
        for (var i = 0; i < 96; i++)
        {
            Assert.Equal(Math.Round(Math.Pow(10, i / 96.0), 2), ESeries.E96.Mantissas[i], 12);
        }

        Assert.Equal([1.00, 1.02, 1.05, 1.07, 1.10], ESeries.E96.Mantissas.Take(5));
        Assert.Equal([9.09, 9.31, 9.53, 9.76], ESeries.E96.Mantissas.TakeLast(4));
    }

    [Fact]
    public void E48_IsEverySecondE96Value()
    {
        // IEC 60063:2015 [published]; E48 begins 1.00 1.05 1.10 1.15 1.21 and ends 9.53.
        Assert.Equal(48, ESeries.E48.Mantissas.Count);
        Assert.Equal(ESeries.E96.Mantissas.Where((_, i) => i % 2 == 0), ESeries.E48.Mantissas);
        Assert.Equal([1.00, 1.05, 1.10, 1.15, 1.21], ESeries.E48.Mantissas.Take(5));
        Assert.Equal(9.53, ESeries.E48.Mantissas[^1]);
    }

    [Fact]
    public void E12_IsEverySecondE24Value()
    {
        // IEC 60063:2015 [published]: E12 = 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2.
        Assert.Equal([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2], ESeries.E12.Mantissas);
    }

    [Theory]
    [InlineData(16, 3, 4700.0)]
    [InlineData(16, 0, 4.7)]
    [InlineData(16, -1, 0.47)]
    [InlineData(0, 6, 1_000_000.0)]
    public void ValueAt_ScalesByDecadeExactly(int index, int decade, double expected)
    {
        Assert.Equal(expected, ESeries.E24.ValueAt(index, decade));
    }

    [Theory]
    [InlineData(9382.716, 9310.0)]   // ln(9382.7/9310) = 0.0078 < ln(9530/9382.7) = 0.0156
    [InlineData(106302.8, 107000.0)] // ln(107000/106302.8) = 0.0065 < ln(106302.8/105000) = 0.0123
    [InlineData(9.9, 10.0)]          // next decade's first value
    [InlineData(1000.0, 1000.0)]
    [InlineData(0.995, 1.0)]
    public void Nearest_E96_IsClosestInLogSpace(double ohms, double expected)
    {
        Assert.Equal(expected, ESeries.E96.Nearest(ohms));
    }

    [Fact]
    public void Nearest_GeometricMidpoint_DecidesByRatioNotDifference()
    {
        // Between 1.0 kΩ and 1.1 kΩ (E24) the geometric midpoint is √(1000·1100) = 1048.81 Ω.
        // 1049 Ω: ln(1049/1000) = 0.04784 > ln(1100/1049) = 0.04747 → 1.1 kΩ, though 49 Ω < 51 Ω in difference.
        // 1048 Ω: ln(1048/1000) = 0.04688 < ln(1100/1048) = 0.04843 → 1.0 kΩ.
        Assert.Equal(1100.0, ESeries.E24.Nearest(1049));
        Assert.Equal(1000.0, ESeries.E24.Nearest(1048));
    }

    [Fact]
    public void ValuesBetween_OneDecade_ListsTheSeriesOnce()
    {
        var values = ESeries.E12.ValuesBetween(1000, 9999);

        Assert.Equal([1000.0, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200], values);
    }

    [Theory]
    [InlineData("E96", true)]
    [InlineData("e24", true)]
    [InlineData("E6", false)]
    [InlineData(null, false)]
    public void TryParse_KnownNames_Only(string? name, bool expected)
    {
        Assert.Equal(expected, ESeries.TryParse(name, out _));
    }
}
