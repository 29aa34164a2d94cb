namespace LineTest.Core.Stability;

/// <summary>
/// The search for a fit's time constant τ shared by <see cref="ExponentialApproachFit"/> and
/// <see cref="FollowerApproachFit"/>: for a fixed τ the other parameters are linear (solved by least squares), so only the
/// residual sum of squares as a function of τ is minimised — over ln τ, first on an even grid (the minimum may be
/// anywhere between a tenth of the sample step and many spans), then by golden-section search between the best grid
/// point's neighbours.
/// </summary>
internal static class TimeConstantSearch
{
    /// <summary>Points of the grid over ln τ.</summary>
    public const int GridPoints = 60;

    private static readonly double InverseGolden = (Math.Sqrt(5) - 1) / 2;

    /// <summary>The grid point (0 … <see cref="GridPoints"/> − 1) with the smallest <paramref name="ssr"/>; −1 when none is below infinity.</summary>
    /// <param name="ssr">Residual sum of squares at a τ (seconds).</param>
    /// <param name="logLow">ln of the shortest τ searched.</param>
    /// <param name="logHigh">ln of the longest τ searched.</param>
    public static int BestGridPoint(Func<double, double> ssr, double logLow, double logHigh)
    {
        var bestIndex = -1;
        var bestSsr = double.PositiveInfinity;
        for (var k = 0; k < GridPoints; k++)
        {
            var value = ssr(Math.Exp(logLow + ((logHigh - logLow) * k / (GridPoints - 1))));
            if (value < bestSsr)
            {
                bestSsr = value;
                bestIndex = k;
            }
        }

        return bestIndex;
    }

    /// <summary>
    /// ln τ of the minimum of <paramref name="ssr"/> between the neighbours of the inner grid point
    /// <paramref name="bestIndex"/>, by golden-section search until the bracket is narrower than <paramref name="tolerance"/>
    /// or after <paramref name="iterations"/> steps.
    /// </summary>
    public static double Refine(Func<double, double> ssr, double logLow, double logHigh, int bestIndex, int iterations, double tolerance)
    {
        var step = (logHigh - logLow) / (GridPoints - 1);
        double low = logLow + (step * (bestIndex - 1)), high = logLow + (step * (bestIndex + 1));
        var c = high - (InverseGolden * (high - low));
        var d = low + (InverseGolden * (high - low));
        var fc = ssr(Math.Exp(c));
        var fd = ssr(Math.Exp(d));
        for (var k = 0; k < iterations && high - low > tolerance; k++)
        {
            if (fc <= fd)
            {
                (high, d, fd) = (d, c, fc);
                c = high - (InverseGolden * (high - low));
                fc = ssr(Math.Exp(c));
            }
            else
            {
                (low, c, fc) = (c, d, fd);
                d = low + (InverseGolden * (high - low));
                fd = ssr(Math.Exp(d));
            }
        }

        return (low + high) / 2;
    }
}
