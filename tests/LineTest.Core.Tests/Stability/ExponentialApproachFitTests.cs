using LineTest.Core.Stability;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;
using MathNet.Numerics.Statistics;

namespace LineTest.Core.Tests.Stability;

public sealed class ExponentialApproachFitTests
{
    // A block heating from 20 °C towards 50 °C with τ = 40 s (the demo block's order of magnitude), read every 2 s.
    private const double FinalC = 50;
    private const double AmplitudeC = -30;
    private const double TauSeconds = 40;
    private const double IntervalSeconds = 2;

    public static TheoryData<double, double, double> Approaches => new()
    {
        { FinalC, AmplitudeC, TauSeconds },
        { -20, 40, 25 },
        { 120.5, -0.8, 60 },
    };

    [Theory]
    [MemberData(nameof(Approaches))]
    public void Fit_NoiseFreeExponential_RecoversExactParameters(double final, double amplitude, double tau)
    {
        // [derived] closed form: readings generated from y(t) = y∞ + A·exp(−t/τ) itself, so the least-squares
        // solution is the generating parameters with zero residual and zero uncertainty.
        var readings = Approach(final, amplitude, tau, 0, 90, noise: null);

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.True(fit.Converged, fit.Why);
        Assert.False(fit.Disturbed);
        Assert.Equal(final, fit.FinalValue, 1e-6);
        Assert.Equal(amplitude, fit.Amplitude, 1e-6);
        Assert.Equal(tau, fit.TimeConstantSeconds, tau * 1e-6);
        Assert.True(fit.ResidualRms < 1e-9, $"residual RMS {fit.ResidualRms}");
        Assert.True(fit.FinalValueStandardUncertainty < 1e-6, $"u(y∞) {fit.FinalValueStandardUncertainty}");
    }

    [Fact]
    public void Fit_NoiseFreeExponential_IgnoresTheTimeOrigin()
    {
        // [derived] the model is shift-invariant in t (the amplitude absorbs exp(−t₀/τ)): the final value and τ
        // must not depend on when the clock started.
        var shifted = Approach(FinalC, AmplitudeC, TauSeconds, 0, 90, noise: null).Select(r => (r.Seconds + 3600.0, r.Value)).ToList();

        var fit = ExponentialApproachFit.Fit(shifted);

        Assert.Equal(FinalC, fit.FinalValue, 1e-6);
        Assert.Equal(TauSeconds, fit.TimeConstantSeconds, 1e-4);
    }

    [Fact]
    public void Fit_NoisyApproach_AgreesWithMathNetLevenbergMarquardt()
    {
        // [reference library] MathNet.Numerics LevenbergMarquardtMinimizer on the same model, analytic Jacobian,
        // started from a crude guess; its StandardErrors are sqrt(diag((JᵀJ)⁻¹)·SSR/(n − p)), the same definition.
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 70, new Normal(0, 0.02, new Random(2111)));
        var x = Vector<double>.Build.DenseOfEnumerable(readings.Select(r => r.Seconds));
        var y = Vector<double>.Build.DenseOfEnumerable(readings.Select(r => r.Value));
        var model = ObjectiveFunction.NonlinearModel(
            (p, t) => t.Map(ti => p[0] + (p[1] * Math.Exp(-ti / p[2]))),
            (p, t) =>
            {
                var j = Matrix<double>.Build.Dense(t.Count, 3);
                for (var i = 0; i < t.Count; i++)
                {
                    var e = Math.Exp(-t[i] / p[2]);
                    j[i, 0] = 1;
                    j[i, 1] = e;
                    j[i, 2] = p[1] * t[i] * e / (p[2] * p[2]);
                }

                return j;
            },
            x,
            y);
        var reference = new LevenbergMarquardtMinimizer(maximumIterations: 10_000)
            .FindMinimum(model, Vector<double>.Build.DenseOfArray([y[^1], y[0] - y[^1], 20.0]));

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.True(fit.Converged, fit.Why);
        Assert.Equal(reference.MinimizingPoint[0], fit.FinalValue, 1e-5);
        Assert.Equal(reference.MinimizingPoint[1], fit.Amplitude, 1e-5);
        Assert.Equal(reference.MinimizingPoint[2], fit.TimeConstantSeconds, 1e-3);
        Assert.Equal(1.0, fit.FinalValueStandardUncertainty / reference.StandardErrors[0], 0.01);
        Assert.Equal(1.0, fit.TimeConstantStandardUncertainty / reference.StandardErrors[2], 0.01);
    }

    [Fact]
    public void FinalValueUncertainty_AgreesWithMonteCarloOfTheSameModel()
    {
        // [published method] JCGM 101:2008 (GUM Supplement 1) propagation by Monte Carlo: 500 noisy draws of the same
        // approach (σ = 0.02 °C, readings for the first 60 s only, so the final value is an extrapolation), each
        // fitted; the spread of the fitted y∞ is the reference for the predicted u(y∞). Fixed seed.
        const int Draws = 500;
        var noise = new Normal(0, 0.02, new Random(21));
        var finals = new double[Draws];
        var predicted = new double[Draws];
        for (var d = 0; d < Draws; d++)
        {
            var fit = ExponentialApproachFit.Fit(Approach(FinalC, AmplitudeC, TauSeconds, 0, 60, noise));
            Assert.True(fit.Converged, fit.Why);
            finals[d] = fit.FinalValue;
            predicted[d] = fit.FinalValueStandardUncertainty;
        }

        var spread = finals.StandardDeviation();
        var typicalPredicted = predicted.Median();

        Assert.InRange(typicalPredicted / spread, 0.8, 1.2);
        Assert.True(spread > 0.01, $"the draws must make an extrapolation uncertainty to compare (spread {spread})");
        Assert.InRange(finals.Mean() - FinalC, -3 * spread / Math.Sqrt(Draws) - 0.005, 3 * spread / Math.Sqrt(Draws) + 0.005);
    }

    [Fact]
    public void Fit_StepInTheMiddleOfTheApproach_FlagsDisturbance()
    {
        // [common practice] a door opened or a unit inserted late shows as a step the first-order model cannot follow:
        // the residuals come in long same-sign runs (runs test, NIST/SEMATECH e-Handbook §1.3.5.13).
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 90, new Normal(0, 0.01, new Random(7)))
            .Select(r => r.Seconds >= 46 ? (r.Seconds, r.Value - 0.4) : r)
            .ToList();

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.True(fit.Disturbed, $"runs z {fit.RunsZScore}, residual RMS {fit.ResidualRms}");
        Assert.False(fit.IsUsable);
        Assert.Equal("the residuals show a disturbance", fit.Why);
    }

    [Fact]
    public void Fit_SameApproachWithoutTheStep_IsNotDisturbed()
    {
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 90, new Normal(0, 0.01, new Random(7)));

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.True(fit.IsUsable, $"{fit.Why}: runs z {fit.RunsZScore}");
        Assert.True(fit.ResidualRms < 0.02, $"residual RMS {fit.ResidualRms}");
    }

    [Fact]
    public void Fit_ResidualFarAboveTheExpectedNoise_FlagsDisturbance()
    {
        // A single large excursion (a unit touched) does not shorten the runs much, but the residual RMS exceeds
        // four times the meter's stated noise.
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 90, new Normal(0, 0.01, new Random(7)))
            .Select(r => r.Seconds == 50 ? (r.Seconds, r.Value + 1.5) : r)
            .ToList();

        var withoutNoise = ExponentialApproachFit.Fit(readings);
        var withNoise = ExponentialApproachFit.Fit(readings, new ExponentialFitOptions { ExpectedNoiseSd = 0.01 });

        Assert.True(withNoise.Disturbed, $"residual RMS {withNoise.ResidualRms}");
        Assert.True(withoutNoise.ResidualRms > 4 * 0.01);
    }

    [Fact]
    public void Fit_StraightLineEarlyInTheApproach_DoesNotConverge()
    {
        // [derived] a ramp has no curvature: the residual keeps falling as τ grows, so the best τ is the search's
        // upper edge and the final value is not determined.
        var readings = Enumerable.Range(0, 20).Select(i => (i * 2.0, 20 + (0.1 * i))).ToList();

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.False(fit.Converged);
        Assert.False(fit.IsUsable);
        Assert.Contains("too early to extrapolate", fit.Why);
        Assert.True(double.IsNaN(fit.FinalValue));
    }

    [Fact]
    public void Fit_TooFewReadings_DoesNotConverge()
    {
        var fit = ExponentialApproachFit.Fit(Approach(FinalC, AmplitudeC, TauSeconds, 0, 8, noise: null));

        Assert.False(fit.Converged);
        Assert.Equal("only 5 readings; a fit needs at least 6", fit.Why);
    }

    [Fact]
    public void Fit_NotANumberReading_DoesNotConvergeAndSaysWhich()
    {
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 40, noise: null);
        readings[3] = (readings[3].Seconds, double.NaN);

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.False(fit.Converged);
        Assert.Equal("reading 3 is not a finite number", fit.Why);
    }

    [Fact]
    public void Fit_TimeRunningBackwards_DoesNotConvergeAndSaysWhere()
    {
        var readings = Approach(FinalC, AmplitudeC, TauSeconds, 0, 40, noise: null);
        readings[5] = (readings[3].Seconds, readings[5].Value);

        var fit = ExponentialApproachFit.Fit(readings);

        Assert.False(fit.Converged);
        Assert.Equal("reading 5 is earlier than reading 4", fit.Why);
    }

    private static List<(double Seconds, double Value)> Approach(double final, double amplitude, double tau, double from, double to, Normal? noise)
    {
        var readings = new List<(double, double)>();
        for (var t = from; t <= to + 1e-9; t += IntervalSeconds)
        {
            readings.Add((t, final + (amplitude * Math.Exp(-t / tau)) + (noise?.Sample() ?? 0)));
        }

        return readings;
    }
}
