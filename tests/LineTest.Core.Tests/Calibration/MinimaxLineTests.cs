using LineTest.Core.Calibration;

namespace LineTest.Core.Tests.Calibration;

public sealed class MinimaxLineTests
{
    [Fact]
    public void Fit_SquareOnMinusOneToOne_IsTheConstantOneHalfWithErrorOneHalf()
    {
        // Chebyshev equioscillation (e.g. Powell, Approximation Theory and Methods, ch. 7 [from memory]): the best line
        // for a convex f on [a, b] has its error alternate at a, ξ and b, where f'(ξ) equals the chord's slope. For x² on
        // [−1, 1] the chord is flat, so ξ = 0 and b = 0; from 1 − c = h and 0 − c = −h: c = 1/2, h = 1/2 [derived].
        var best = MinimaxLine.Fit(x => x * x, -1, 1, 201);

        Assert.Equal(0.5, best.Intercept, 12);
        Assert.Equal(0.0, best.Slope, 12);
        Assert.Equal(0.5, best.MaxAbsError, 12);
        Assert.Equal([-1.0, 0.0, 1.0], best.ReferenceX.Select(x => Math.Round(x, 12)));
        Assert.Equal([0.5, -0.5, 0.5], best.ReferenceErrors.Select(e => Math.Round(e, 12)));
    }

    [Fact]
    public void Fit_ExponentialOnZeroToOne_MatchesTextbookLine()
    {
        // The textbook example: best line for eˣ on [0, 1] is 0.8941 + 1.7183·x with error 0.1059 (numerical-analysis
        // textbooks [from memory]); derived: b = e − 1, ξ = ln(e − 1), a = (1 + eᶻ − b·ξ)/2, h = 1 − a [derived].
        var b = Math.E - 1;
        var xi = Math.Log(b);
        var a = (1 + Math.Exp(xi) - (b * xi)) / 2;

        var best = MinimaxLine.Fit(Math.Exp, 0, 1, 10001);

        Assert.Equal(b, best.Slope, 6);
        Assert.Equal(a, best.Intercept, 6);
        Assert.Equal(1 - a, best.MaxAbsError, 6);
        Assert.Equal(0.8941, best.Intercept, 4);
        Assert.Equal(0.1059, best.MaxAbsError, 4);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    public void Fit_AnyCurve_ErrorEquioscillatesAndNoNearbyLineDoesBetter(int seed)
    {
        var random = new Random(seed);
        var (c1, c2, c3) = (random.NextDouble() - 0.5, random.NextDouble() - 0.5, random.NextDouble() - 0.5);
        double F(double x) => Math.Sin(3 * c1 * x) + (c2 * x * x) + (c3 * Math.Abs(x - 0.3));
        var x = Enumerable.Range(0, 401).Select(i => -1 + (i / 200.0)).ToArray();
        var y = x.Select(F).ToArray();

        var best = MinimaxLine.Fit(x, y);

        // Equal magnitude, alternating sign at three points, and that magnitude is the largest error anywhere.
        Assert.Equal(3, best.ReferenceErrors.Count);
        Assert.All(best.ReferenceErrors, e => Assert.Equal(best.MaxAbsError, Math.Abs(e), 9));
        Assert.True(best.ReferenceErrors[0] * best.ReferenceErrors[1] < 0 && best.ReferenceErrors[1] * best.ReferenceErrors[2] < 0);
        for (var k = 0; k < 50; k++)
        {
            var (da, db) = ((random.NextDouble() - 0.5) * 1e-3, (random.NextDouble() - 0.5) * 1e-3);
            var other = x.Select((xi, i) => Math.Abs(y[i] - (best.Intercept + da) - ((best.Slope + db) * xi))).Max();
            Assert.True(other >= best.MaxAbsError - 1e-12, $"({da}, {db}) gave {other} < {best.MaxAbsError}");
        }
    }

    [Fact]
    public void Fit_FewerThanThreeSamples_Throws()
    {
        Assert.Throws<ArgumentException>(() => MinimaxLine.Fit([0.0, 1.0], [0.0, 1.0]));
    }

    [Fact]
    public void Fit_AbscissaeNotIncreasing_Throws()
    {
        Assert.Throws<ArgumentException>(() => MinimaxLine.Fit([0.0, 2.0, 1.0], [0.0, 1.0, 2.0]));
    }
}
