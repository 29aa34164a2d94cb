namespace LineTest.Core.Stability;

/// <summary>
/// Least-squares fit of a first-order approach y(t) = y∞ + A·exp(−t/τ) to timed readings, used to predict where a block
/// or a unit will settle before it is still. The fit separates the two linear parameters (y∞, A) from τ: for a given τ
/// they follow from ordinary least squares, so only τ is searched (variable projection, Golub &amp; Pereyra 1973). The
/// search is a log-spaced grid over τ followed by a golden-section refinement, which needs no starting guess and cannot
/// diverge. The covariance of (y∞, A, τ) is the Gauss–Newton one, s²·(JᵀJ)⁻¹ with s² = SSR/(n − 3) (GUM JCGM 100:2008
/// §H.3 for the least-squares case; Bates &amp; Watts 1988 §2.3 for nonlinear models), so u(y∞) is the fit's own
/// standard uncertainty of the extrapolated final value. No I/O; times are seconds from any origin.
/// </summary>
public static class ExponentialApproachFit
{
    /// <summary>Fewest readings a fit accepts: three parameters and at least three degrees of freedom.</summary>
    public const int MinimumReadings = 6;

    private const int GoldenIterations = 80;

    /// <summary>Fits the approach to <paramref name="readings"/> (time-ordered, seconds and value).</summary>
    /// <param name="readings">The readings; times must be finite and non-decreasing.</param>
    /// <param name="options">Search range and disturbance test; defaults when null.</param>
    /// <returns>The fit, or a result whose <see cref="ExponentialApproachResult.Converged"/> is false with the reason.</returns>
    public static ExponentialApproachResult Fit(IReadOnlyList<(double Seconds, double Value)> readings, ExponentialFitOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(readings);
        options ??= ExponentialFitOptions.Default;
        var n = readings.Count;
        if (n < MinimumReadings)
        {
            return ExponentialApproachResult.NotConverged(n, $"only {n} readings; a fit needs at least {MinimumReadings}");
        }

        var t = new double[n];
        var y = new double[n];
        var origin = readings[0].Seconds;
        for (var i = 0; i < n; i++)
        {
            var (seconds, value) = readings[i];
            if (!double.IsFinite(seconds) || !double.IsFinite(value))
            {
                return ExponentialApproachResult.NotConverged(n, $"reading {i} is not a finite number");
            }

            if (i > 0 && seconds < readings[i - 1].Seconds)
            {
                return ExponentialApproachResult.NotConverged(n, $"reading {i} is earlier than reading {i - 1}");
            }

            t[i] = seconds - origin;
            y[i] = value;
        }

        var span = t[n - 1];
        if (span <= 0)
        {
            return ExponentialApproachResult.NotConverged(n, "the readings span no time");
        }

        // τ is searched from a tenth of the shortest useful step to a multiple of the span; a minimum on either edge
        // means the data hold no usable curvature (already flat, or far too early on the curve to extrapolate).
        var logLow = Math.Log(span * options.MinTauFractionOfSpan);
        var logHigh = Math.Log(span * options.MaxTauMultipleOfSpan);
        double Ssr(double tau) => ProjectedSsr(t, y, tau, out _, out _);
        var bestIndex = Math.Max(0, TimeConstantSearch.BestGridPoint(Ssr, logLow, logHigh));
        if (bestIndex == 0 || bestIndex == TimeConstantSearch.GridPoints - 1)
        {
            var edge = bestIndex == 0 ? "shorter than the search range" : "longer than the search range (too early to extrapolate)";
            return ExponentialApproachResult.NotConverged(n, $"best time constant is {edge}");
        }

        var tau = Math.Exp(TimeConstantSearch.Refine(Ssr, logLow, logHigh, bestIndex, GoldenIterations, 1e-12));
        var finalSsr = ProjectedSsr(t, y, tau, out var yInf, out var amplitude);
        return Assemble(t, y, tau, yInf, amplitude, finalSsr, options);
    }

    private static ExponentialApproachResult Assemble(double[] t, double[] y, double tau, double yInf, double amplitude, double ssr, ExponentialFitOptions options)
    {
        var n = t.Length;
        if (!double.IsFinite(ssr) || !double.IsFinite(yInf) || !double.IsFinite(amplitude))
        {
            return ExponentialApproachResult.NotConverged(n, "the fit produced a value that is not a finite number");
        }

        // JᵀJ for the columns ∂y/∂y∞ = 1, ∂y/∂A = e, ∂y/∂τ = A·t·e/τ², with e = exp(−t/τ).
        var m = new double[3, 3];
        var residuals = new double[n];
        for (var i = 0; i < n; i++)
        {
            var e = Math.Exp(-t[i] / tau);
            Span<double> j = [1.0, e, amplitude * t[i] * e / (tau * tau)];
            for (var r = 0; r < 3; r++)
            {
                for (var c = 0; c < 3; c++)
                {
                    m[r, c] += j[r] * j[c];
                }
            }

            residuals[i] = y[i] - (yInf + (amplitude * e));
        }

        if (!SmallMatrix.TryInvert(m, out var inverse))
        {
            return ExponentialApproachResult.NotConverged(n, "the approach carries no information on its time constant (amplitude too small)");
        }

        var variance = ssr / (n - 3);
        var rms = Math.Sqrt(ssr / n);
        var uYInf = Math.Sqrt(Math.Max(0, inverse[0, 0] * variance));
        var uTau = Math.Sqrt(Math.Max(0, inverse[2, 2] * variance));
        var runs = ResidualRuns.Test(residuals, options.DisturbanceTolerance);
        var disturbed = runs.ZScore < -options.RunsTestCriticalZ
            || (options.ExpectedNoiseSd is { } sd && rms > options.NoiseMultipleForDisturbance * sd);
        return new ExponentialApproachResult(
            Converged: true,
            FinalValue: yInf,
            FinalValueStandardUncertainty: uYInf,
            Amplitude: amplitude,
            TimeConstantSeconds: tau,
            TimeConstantStandardUncertainty: uTau,
            ResidualRms: rms,
            Readings: n,
            RunsZScore: runs.ZScore,
            Disturbed: disturbed,
            Why: disturbed ? "the residuals show a disturbance" : "converged");
    }

    /// <summary>Residual sum of squares when y∞ and A are the least-squares solution for a fixed τ.</summary>
    private static double ProjectedSsr(double[] t, double[] y, double tau, out double yInf, out double amplitude)
    {
        double n = t.Length, se = 0, see = 0, sy = 0, sey = 0;
        for (var i = 0; i < t.Length; i++)
        {
            var e = Math.Exp(-t[i] / tau);
            se += e;
            see += e * e;
            sy += y[i];
            sey += e * y[i];
        }

        var det = (n * see) - (se * se);
        if (!(det > 1e-12 * n * see))
        {
            yInf = double.NaN;
            amplitude = double.NaN;
            return double.PositiveInfinity;
        }

        amplitude = ((n * sey) - (se * sy)) / det;
        yInf = (sy - (amplitude * se)) / n;
        double ssr = 0;
        for (var i = 0; i < t.Length; i++)
        {
            var r = y[i] - (yInf + (amplitude * Math.Exp(-t[i] / tau)));
            ssr += r * r;
        }

        return ssr;
    }
}
