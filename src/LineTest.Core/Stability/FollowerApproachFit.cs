namespace LineTest.Core.Stability;

/// <summary>
/// Least-squares fit of a sensor that follows a leader's first-order approach through its own first-order lag — a unit
/// in its well following the block: with the leader's time constant τ_L known (from the reference's own
/// <see cref="ExponentialApproachFit"/>), y(t) = y∞ + P·exp(−t/τ_L) + Q·φ(t), φ(t) = (exp(−t/τ) − exp(−t/τ_L))/(1/τ_L − 1/τ),
/// which is the exact response of a first-order lag τ to an exponential input with any starting state. φ is the divided
/// difference of the two exponentials, so it stays finite (→ t·exp(−t/τ_L)) when the follower's τ equals the leader's.
/// As in <see cref="ExponentialApproachFit"/>, (y∞, P, Q) follow from ordinary least squares for each τ and only τ is
/// searched (variable projection, Golub &amp; Pereyra 1973). u(y∞) is the Gauss–Newton one, s²·(JᵀJ)⁻¹ with
/// s² = SSR/(n − 4) (GUM JCGM 100:2008 §H.3), combined with the leader's u(τ_L) propagated by a central difference
/// (JCGM 100:2008 §5.1.3).
/// </summary>
public static class FollowerApproachFit
{
    /// <summary>Fewest readings a fit accepts: four parameters and at least three degrees of freedom.</summary>
    public const int MinimumReadings = 7;

    private const int GoldenIterations = 60;

    /// <summary>φ(t) = (exp(−t/τ) − exp(−t/τ_L))/(1/τ_L − 1/τ), computed without cancellation.</summary>
    public static double Phi(double seconds, double tau, double leaderTau)
    {
        var d = (1 / leaderTau) - (1 / tau);
        var leader = Math.Exp(-seconds / leaderTau);
        var x = seconds * d;
        return Math.Abs(x) < 1e-12 ? leader * seconds : leader * double.ExpM1(x) / d;
    }

    /// <summary>Fits the follower's readings (time-ordered seconds and value) given the leader's time constant.</summary>
    /// <param name="readings">The readings; times finite and non-decreasing.</param>
    /// <param name="leaderTimeConstantSeconds">τ_L, seconds.</param>
    /// <param name="leaderTimeConstantUncertainty">u(τ_L), seconds (0 to ignore).</param>
    /// <param name="options">Search range and disturbance test; defaults when null.</param>
    public static ExponentialApproachResult Fit(
        IReadOnlyList<(double Seconds, double Value)> readings, double leaderTimeConstantSeconds, double leaderTimeConstantUncertainty = 0,
        ExponentialFitOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(readings);
        options ??= ExponentialFitOptions.Default;
        var n = readings.Count;
        if (n < MinimumReadings)
        {
            return ExponentialApproachResult.NotConverged(n, $"only {n} readings; a follower fit needs at least {MinimumReadings}");
        }

        if (!(leaderTimeConstantSeconds > 0) || !double.IsFinite(leaderTimeConstantSeconds))
        {
            return ExponentialApproachResult.NotConverged(n, "the leader's time constant is not a positive number");
        }

        var t = new double[n];
        var y = new double[n];
        for (var i = 0; i < n; i++)
        {
            if (!double.IsFinite(readings[i].Seconds) || !double.IsFinite(readings[i].Value) || (i > 0 && readings[i].Seconds < readings[i - 1].Seconds))
            {
                return ExponentialApproachResult.NotConverged(n, $"reading {i} is not a finite, time-ordered reading");
            }

            t[i] = readings[i].Seconds - readings[0].Seconds;
            y[i] = readings[i].Value;
        }

        var span = t[n - 1];
        if (span <= 0)
        {
            return ExponentialApproachResult.NotConverged(n, "the readings span no time");
        }

        var fit = FitTau(t, y, leaderTimeConstantSeconds, span, options, out var why);
        if (fit is not { } f)
        {
            return ExponentialApproachResult.NotConverged(n, why);
        }

        var uLeader = 0.0;
        if (leaderTimeConstantUncertainty > 0 && double.IsFinite(leaderTimeConstantUncertainty))
        {
            var h = Math.Min(leaderTimeConstantUncertainty, leaderTimeConstantSeconds / 2);
            var up = FitTau(t, y, leaderTimeConstantSeconds + h, span, options, out _);
            var down = FitTau(t, y, leaderTimeConstantSeconds - h, span, options, out _);
            if (up is { } u && down is { } d)
            {
                uLeader = Math.Abs(u.YInf - d.YInf) / (2 * h) * leaderTimeConstantUncertainty;
            }
        }

        return Assemble(t, y, leaderTimeConstantSeconds, f, uLeader, options);
    }

    private static (double Tau, double YInf, double P, double Q, double Ssr)? FitTau(
        double[] t, double[] y, double leaderTau, double span, ExponentialFitOptions options, out string why)
    {
        var logLow = Math.Log(span * options.MinTauFractionOfSpan);
        var logHigh = Math.Log(span * options.MaxTauMultipleOfSpan);
        double Ssr(double tau) => Solve(t, y, leaderTau, tau, out _);
        var bestIndex = TimeConstantSearch.BestGridPoint(Ssr, logLow, logHigh);
        if (bestIndex <= 0 || bestIndex >= TimeConstantSearch.GridPoints - 1)
        {
            why = bestIndex < 0 ? "no time constant gives a fit" : "the follower's best time constant is at the edge of the search range";
            return null;
        }

        var tau = Math.Exp(TimeConstantSearch.Refine(Ssr, logLow, logHigh, bestIndex, GoldenIterations, 1e-10));
        var final = Solve(t, y, leaderTau, tau, out var beta);
        if (!double.IsFinite(final) || beta.Any(b => !double.IsFinite(b)))
        {
            why = "the fit produced a value that is not a finite number";
            return null;
        }

        why = "converged";
        return (tau, beta[0], beta[1], beta[2], final);
    }

    /// <summary>Residual sum of squares with (y∞, P, Q) the least-squares solution for a fixed τ.</summary>
    private static double Solve(double[] t, double[] y, double leaderTau, double tau, out double[] beta)
    {
        var m = new double[3, 3];
        var r = new double[3];
        Span<double> x = stackalloc double[3];
        for (var i = 0; i < t.Length; i++)
        {
            x[0] = 1;
            x[1] = Math.Exp(-t[i] / leaderTau);
            x[2] = Phi(t[i], tau, leaderTau);
            for (var a = 0; a < 3; a++)
            {
                r[a] += x[a] * y[i];
                for (var b = 0; b < 3; b++)
                {
                    m[a, b] += x[a] * x[b];
                }
            }
        }

        if (!SmallMatrix.TryInvert(m, out var inverse))
        {
            beta = [double.NaN, double.NaN, double.NaN];
            return double.PositiveInfinity;
        }

        beta = new double[3];
        for (var a = 0; a < 3; a++)
        {
            for (var b = 0; b < 3; b++)
            {
                beta[a] += inverse[a, b] * r[b];
            }
        }

        double ssr = 0;
        for (var i = 0; i < t.Length; i++)
        {
            var e = y[i] - (beta[0] + (beta[1] * Math.Exp(-t[i] / leaderTau)) + (beta[2] * Phi(t[i], tau, leaderTau)));
            ssr += e * e;
        }

        return ssr;
    }

    private static ExponentialApproachResult Assemble(
        double[] t, double[] y, double leaderTau, (double Tau, double YInf, double P, double Q, double Ssr) f, double uLeader, ExponentialFitOptions options)
    {
        var n = t.Length;
        var m = new double[4, 4];
        var residuals = new double[n];
        var h = f.Tau * 1e-5;
        Span<double> j = stackalloc double[4];
        for (var i = 0; i < n; i++)
        {
            j[0] = 1;
            j[1] = Math.Exp(-t[i] / leaderTau);
            j[2] = Phi(t[i], f.Tau, leaderTau);
            j[3] = f.Q * (Phi(t[i], f.Tau + h, leaderTau) - Phi(t[i], f.Tau - h, leaderTau)) / (2 * h);
            for (var a = 0; a < 4; a++)
            {
                for (var b = 0; b < 4; b++)
                {
                    m[a, b] += j[a] * j[b];
                }
            }

            residuals[i] = y[i] - (f.YInf + (f.P * j[1]) + (f.Q * j[2]));
        }

        if (!SmallMatrix.TryInvert(m, out var inverse))
        {
            return ExponentialApproachResult.NotConverged(n, "the approach carries no information on the follower's time constant");
        }

        var variance = f.Ssr / (n - 4);
        var rms = Math.Sqrt(f.Ssr / n);
        var uFit = Math.Sqrt(Math.Max(0, inverse[0, 0] * variance));
        var uTau = Math.Sqrt(Math.Max(0, inverse[3, 3] * variance));
        var runs = ResidualRuns.Test(residuals, options.DisturbanceTolerance);
        var disturbed = runs.ZScore < -options.RunsTestCriticalZ
            || (options.ExpectedNoiseSd is { } sd && rms > options.NoiseMultipleForDisturbance * sd);
        return new ExponentialApproachResult(
            Converged: true,
            FinalValue: f.YInf,
            FinalValueStandardUncertainty: Math.Sqrt((uFit * uFit) + (uLeader * uLeader)),
            Amplitude: f.Q,
            TimeConstantSeconds: f.Tau,
            TimeConstantStandardUncertainty: uTau,
            ResidualRms: rms,
            Readings: n,
            RunsZScore: runs.ZScore,
            Disturbed: disturbed,
            Why: disturbed ? "the residuals show a disturbance" : "converged")
        {
            LeaderTimeConstantSeconds = leaderTau,
            LeaderAmplitude = f.P,
        };
    }
}
