using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class AndersonDarlingTests
{
    [Theory]
    [InlineData(0.631, 0.10)]
    [InlineData(0.752, 0.05)]
    [InlineData(1.035, 0.01)]
    public void PValue_AtPublishedCriticalValues_GivesTheirLevel(double aStar, double level)
    {
        // D'Agostino & Stephens (1986), case 3 critical values of A*²: 10 % 0.631, 5 % 0.752, 1 % 1.035 [published].
        Assert.Equal(level, AndersonDarling.PValue(aStar), level * 0.05);
    }

    [Theory]
    [InlineData(0.2)]
    [InlineData(0.34)]
    [InlineData(0.6)]
    public void PValue_AtBreaks_IsNearlyContinuous(double at)
    {
        // The pieces of D'Agostino & Stephens (1986) Table 4.9 meet to within a few thousandths [derived].
        var left = AndersonDarling.PValue(at - 1e-9);
        var right = AndersonDarling.PValue(at);
        Assert.True(Math.Abs(left - right) < 0.005, $"p jumps from {left} to {right} at A*² = {at}");
    }

    [Fact]
    public void PValue_Property_NonIncreasingAndInUnitInterval()
    {
        Gen.Select(Gen.Double[0, 400], Gen.Double[0, 5]).Sample(t =>
        {
            // The jumps at the breaks are below 0.005, so allow that much against strict monotonicity.
            var p1 = AndersonDarling.PValue(t.Item1);
            var p2 = AndersonDarling.PValue(t.Item1 + t.Item2);
            return p1 is >= 0 and <= 1 && p2 is >= 0 and <= 1 && p2 <= p1 + 0.005;
        });
    }

    [Fact]
    public void Adjust_AppliesSmallSampleFactor()
    {
        // A*² = A²·(1 + 0.75/n + 2.25/n²), D'Agostino & Stephens (1986) [published].
        Assert.Equal(0.5 * (1 + (0.75 / 10) + (2.25 / 100)), AndersonDarling.Adjust(0.5, 10), 1e-15);
    }

    [Fact]
    public void Test_SampleData_MatchesDirectFormulaWithMathNet()
    {
        var values = new double[40];
        Normal.Samples(new Random(17), values, 5, 2);
        for (var i = 0; i < values.Length; i += 7)
        {
            values[i] += 1.5; // skew it a little so A² is not tiny
        }

        // A² = −n − (1/n)·Σ(2i − 1)·[ln Φ(z_i) + ln(1 − Φ(z_{n+1−i}))], written out directly, with MathNet's
        // Normal.CDF as independent reference (D'Agostino & Stephens 1986 [published]).
        var n = values.Length;
        var sorted = values.Order().ToArray();
        var mean = sorted.Average();
        var sd = Math.Sqrt(sorted.Sum(v => (v - mean) * (v - mean)) / (n - 1));
        double s = 0;
        for (var i = 1; i <= n; i++)
        {
            s += ((2 * i) - 1) * (Math.Log(Normal.CDF(mean, sd, sorted[i - 1])) + Math.Log(1 - Normal.CDF(mean, sd, sorted[n - i])));
        }

        var expected = -n - (s / n);
        var result = AndersonDarling.Test(values).Value!;
        Assert.Equal(expected, result.ASquared, 1e-10);
        Assert.Equal(AndersonDarling.Adjust(expected, n), result.AStarSquared, 1e-10);
        Assert.Equal(AndersonDarling.PValue(result.AStarSquared), result.PValue, 1e-15);
    }

    [Fact]
    public void Test_NormalSamples_RejectAboutFivePercentAtFivePercent()
    {
        // Under normality the p-value is close to uniform, so about 5 % of samples fall below 0.05
        // [property of a valid test]; a fixed seed keeps the count reproducible.
        var random = new Random(2024);
        var rejections = 0;
        const int trials = 400;
        var buffer = new double[50];
        for (var t = 0; t < trials; t++)
        {
            Normal.Samples(random, buffer, 20, 0.3);
            if (AndersonDarling.Test(buffer).Value!.PValue < 0.05)
            {
                rejections++;
            }
        }

        Assert.InRange(rejections, 8, 36);
    }

    [Fact]
    public void Test_ExponentialSample_IsRejected()
    {
        var values = new double[200];
        Exponential.Samples(new Random(9), values, 1.0);
        Assert.True(AndersonDarling.Test(values).Value!.PValue < 0.001);
    }

    [Fact]
    public void Test_DoesNotReorderInput()
    {
        double[] values = [3, 1, 2, 5, 4];
        AndersonDarling.Test(values);
        Assert.Equal([3.0, 1, 2, 5, 4], values);
    }

    [Fact]
    public void Test_TwoValues_NotComputedWithReason()
    {
        var outcome = AndersonDarling.Test([1.0, 2.0]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("at least 3", outcome.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Test_ConstantValues_NotComputedWithReason()
    {
        var outcome = AndersonDarling.Test([4.0, 4.0, 4.0, 4.0]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("equal", outcome.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void PValue_BeyondTurningPoint_DoesNotRise()
    {
        Assert.True(AndersonDarling.PValue(10_000) <= AndersonDarling.PValue(150));
    }

    [Fact]
    public void Test_WithTheSortedValuesGiven_ExactlyTheResultOfSortingItself()
    {
        // The shared-sort overload takes the mean and σ from the values in their own order, so nothing moves, not even
        // the last bit [derived: same arithmetic in the same order].
        Gen.Double[-1e3, 1e3].Array[3, 300].Sample(values =>
        {
            var sorted = values.Order().ToArray();
            return Equals(AndersonDarling.Test(values).Value, AndersonDarling.Test(values, sorted).Value);
        });
    }

    [Fact]
    public void Test_SortedNotAscending_ThrowsNamingWhere()
    {
        double[] values = [3, 1, 2, 5, 4];
        var ex = Assert.Throws<ArgumentException>(() => AndersonDarling.Test(values, [1.0, 2, 4, 3, 5]));
        Assert.Contains("sorted[2]", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Test_SortedOfAnotherLength_Throws()
    {
        Assert.Throws<ArgumentException>(() => AndersonDarling.Test([3.0, 1, 2, 5], [1.0, 2, 3]));
    }
}
