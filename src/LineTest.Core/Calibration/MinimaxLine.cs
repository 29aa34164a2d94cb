namespace LineTest.Core.Calibration;

/// <summary>
/// The best straight line in the minimax (Chebyshev) sense: the line a + b·x that makes the largest |y − (a + b·x)|
/// over the given samples as small as it can be.
/// </summary>
/// <remarks>
/// <para>Chebyshev's equioscillation theorem: the best approximation by a polynomial of degree m is the one whose error
/// reaches its largest magnitude with alternating signs at m + 2 points (for a line, three). Computed by the Remez
/// exchange on the samples: solve for the line that levels the error at three reference points with alternating sign,
/// find the sample of largest error, exchange it into the reference keeping the signs alternating, and repeat until the
/// largest error equals the levelled one (approximation-theory textbooks, e.g. Powell, Approximation Theory and Methods,
/// ch. 7–8 [from memory]).</para>
/// <para>For a convex or concave curve the three points are both ends of the range and the point where the curve's
/// slope equals the chord's; the line is the chord lowered by half the largest gap, so the curvature is shared equally
/// above and below zero.</para>
/// </remarks>
public static class MinimaxLine
{
    private const int MaxIterations = 100;

    /// <summary>The minimax line through samples (<paramref name="x"/>, <paramref name="y"/>), x strictly increasing.</summary>
    public static MinimaxLineResult Fit(IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(y);
        if (x.Count != y.Count)
        {
            throw new ArgumentException($"{x.Count} abscissae but {y.Count} ordinates.", nameof(y));
        }

        if (x.Count < 3)
        {
            throw new ArgumentException("A minimax line needs at least three samples.", nameof(x));
        }

        for (var i = 0; i < x.Count; i++)
        {
            if (!double.IsFinite(x[i]) || !double.IsFinite(y[i]) || (i > 0 && !(x[i] > x[i - 1])))
            {
                throw new ArgumentException($"Sample {i} is not finite or x does not increase there.", nameof(x));
            }
        }

        int[] reference = [0, x.Count / 2, x.Count - 1];
        double a = 0, b = 0, level = 0;
        for (var iteration = 0; iteration < MaxIterations; iteration++)
        {
            (a, b, level) = Level(x, y, reference);
            var worst = 0;
            var worstError = 0.0;
            for (var k = 0; k < x.Count; k++)
            {
                var error = Math.Abs(y[k] - a - (b * x[k]));
                if (error > worstError)
                {
                    worstError = error;
                    worst = k;
                }
            }

            if (worstError <= (Math.Abs(level) * (1 + 1e-12)) + 1e-300 || reference.Contains(worst))
            {
                break;
            }

            reference = Exchange(x, y, a, b, reference, worst);
        }

        var maxError = 0.0;
        for (var k = 0; k < x.Count; k++)
        {
            maxError = Math.Max(maxError, Math.Abs(y[k] - a - (b * x[k])));
        }

        return new MinimaxLineResult(a, b, maxError, reference.Select(i => x[i]).ToArray(), reference.Select(i => y[i] - a - (b * x[i])).ToArray());
    }

    /// <summary>The minimax line of <paramref name="f"/> sampled at <paramref name="samples"/> evenly spaced points of [low, high].</summary>
    public static MinimaxLineResult Fit(Func<double, double> f, double low, double high, int samples = 361)
    {
        ArgumentNullException.ThrowIfNull(f);
        ArgumentOutOfRangeException.ThrowIfLessThan(samples, 3);
        if (!(high > low))
        {
            throw new ArgumentOutOfRangeException(nameof(high), high, "The range must have high above low.");
        }

        var x = Enumerable.Range(0, samples).Select(i => low + ((high - low) * i / (samples - 1))).ToArray();
        return Fit(x, x.Select(f).ToArray());
    }

    /// <summary>
    /// The line that levels the error at the three reference points with alternating signs:
    /// y₀ − L(x₀) = h, y₁ − L(x₁) = −h, y₂ − L(x₂) = h.
    /// </summary>
    private static (double A, double B, double H) Level(IReadOnlyList<double> x, IReadOnlyList<double> y, int[] r)
    {
        var b = (y[r[2]] - y[r[0]]) / (x[r[2]] - x[r[0]]);
        var a = (y[r[0]] + y[r[1]] - (b * (x[r[0]] + x[r[1]]))) / 2;
        return (a, b, y[r[0]] - a - (b * x[r[0]]));
    }

    /// <summary>Puts <paramref name="k"/> into the reference in place of a neighbour of the same error sign (single-point exchange).</summary>
    private static int[] Exchange(IReadOnlyList<double> x, IReadOnlyList<double> y, double a, double b, int[] r, int k)
    {
        double Sign(int i) => Math.Sign(y[i] - a - (b * x[i]));
        var s = Sign(k);
        if (x[k] < x[r[0]])
        {
            return s == Sign(r[0]) ? [k, r[1], r[2]] : [k, r[0], r[1]];
        }

        if (x[k] > x[r[2]])
        {
            return s == Sign(r[2]) ? [r[0], r[1], k] : [r[1], r[2], k];
        }

        if (x[k] < x[r[1]])
        {
            return s == Sign(r[0]) ? [k, r[1], r[2]] : [r[0], k, r[2]];
        }

        return s == Sign(r[1]) ? [r[0], k, r[2]] : [r[0], r[1], k];
    }
}
