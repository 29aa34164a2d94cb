using LineTest.Core.Stability;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.Statistics;

namespace LineTest.Core.Tests.Stability;

public sealed class FollowerApproachFitTests
{
    // A well approaching +40 °C with τ_L = 40 s from 10 °C below, and a unit that started 14 °C below and follows it.
    private const double LeaderFinalC = 40;
    private const double LeaderAmplitudeC = -10;
    private const double LeaderTau = 40;
    private const double UnitStartC = 26;
    private const double IntervalSeconds = 2;

    public static TheoryData<double> FollowerTaus => new() { 32, 40, 40.0001, 48, 90 };

    [Theory]
    [MemberData(nameof(FollowerTaus))]
    public void Fit_ClosedFormFollower_RecoversFinalValueAndTimeConstant(double tau)
    {
        // [derived] closed form of dy/dt = (L(t) − y)/τ with L(t) = L∞ + A·exp(−t/τ_L):
        // y(t) = L∞ + K·exp(−t/τ_L) + (y0 − L∞ − K)·exp(−t/τ), K = A·τ_L/(τ_L − τ); for τ = τ_L, y(t) = L∞ + (y0 − L∞ + A·t/τ)·exp(−t/τ).
        var readings = Readings(t => ClosedForm(t, tau), 0, 160, noise: null);

        var fit = FollowerApproachFit.Fit(readings, LeaderTau);

        Assert.True(fit.Converged, fit.Why);
        Assert.False(fit.Disturbed);
        Assert.Equal(LeaderFinalC, fit.FinalValue, 1e-6);
        Assert.Equal(tau, fit.TimeConstantSeconds, tau * 1e-4);
        Assert.True(fit.ResidualRms < 1e-5, $"residual RMS {fit.ResidualRms}");
        Assert.Equal(LeaderTau, fit.LeaderTimeConstantSeconds);
        Assert.All(readings, r => Assert.Equal(r.Value, fit.ValueAt(r.Seconds), 1e-5));
    }

    [Fact]
    public void Fit_FollowerIntegratedByRungeKutta_AgreesWithTheIntegration()
    {
        // [derived] an independent route to the same curve: classical fourth-order Runge–Kutta of dy/dt = (L(t) − y)/τ,
        // step 0.01 s, τ = 55 s; the fit must find L∞ and τ that the integration used.
        const double tau = 55;
        var values = new Dictionary<int, double>();
        double y = UnitStartC, t = 0;
        const double h = 0.01;
        double Slope(double time, double value) => (LeaderFinalC + (LeaderAmplitudeC * Math.Exp(-time / LeaderTau)) - value) / tau;
        for (var step = 0; step <= 18000; step++)
        {
            if (step % 200 == 0)
            {
                values[step / 100] = y;
            }

            var k1 = Slope(t, y);
            var k2 = Slope(t + (h / 2), y + (h / 2 * k1));
            var k3 = Slope(t + (h / 2), y + (h / 2 * k2));
            var k4 = Slope(t + h, y + (h * k3));
            y += h / 6 * (k1 + (2 * k2) + (2 * k3) + k4);
            t += h;
        }

        var fit = FollowerApproachFit.Fit(values.OrderBy(p => p.Key).Select(p => ((double)p.Key, p.Value)).ToList(), LeaderTau);

        Assert.True(fit.Converged, fit.Why);
        Assert.Equal(LeaderFinalC, fit.FinalValue, 1e-6);
        Assert.Equal(tau, fit.TimeConstantSeconds, 1e-3);
    }

    [Fact]
    public void FinalValueUncertainty_AgreesWithMonteCarloOfTheSameModel()
    {
        // [published method] JCGM 101:2008 propagation by Monte Carlo: 400 noisy draws (σ = 0.005 °C, the order of a
        // unit's output noise) of the first 120 s of the approach, each fitted; the spread of y∞ is the reference for
        // the predicted u(y∞). Fixed seed.
        const int Draws = 400;
        var noise = new Normal(0, 0.005, new Random(33));
        var finals = new double[Draws];
        var predicted = new double[Draws];
        for (var d = 0; d < Draws; d++)
        {
            var fit = FollowerApproachFit.Fit(Readings(t => ClosedForm(t, 48), 0, 120, noise), LeaderTau);
            Assert.True(fit.Converged, fit.Why);
            finals[d] = fit.FinalValue;
            predicted[d] = fit.FinalValueStandardUncertainty;
        }

        var spread = finals.StandardDeviation();

        Assert.InRange(predicted.Median() / spread, 0.8, 1.25);
        Assert.True(spread > 0.002, $"the draws must make an extrapolation uncertainty to compare (spread {spread})");
        Assert.InRange(finals.Mean() - LeaderFinalC, -4 * spread / Math.Sqrt(Draws), 4 * spread / Math.Sqrt(Draws));
    }

    [Fact]
    public void Fit_LeaderTimeConstantUncertainty_WidensTheFinalValueUncertainty()
    {
        // [derived] JCGM 100:2008 §5.1.3: u(τ_L) propagates through ∂y∞/∂τ_L; with a 10 % u(τ_L) early on the curve the
        // combined u(y∞) must exceed the fit's own.
        var readings = Readings(t => ClosedForm(t, 48), 0, 60, new Normal(0, 0.005, new Random(5)));

        var own = FollowerApproachFit.Fit(readings, LeaderTau);
        var withLeader = FollowerApproachFit.Fit(readings, LeaderTau, leaderTimeConstantUncertainty: 4);

        Assert.True(withLeader.FinalValueStandardUncertainty > own.FinalValueStandardUncertainty * 1.2,
            $"{withLeader.FinalValueStandardUncertainty} vs {own.FinalValueStandardUncertainty}");
        Assert.Equal(own.FinalValue, withLeader.FinalValue, 12);
    }

    [Fact]
    public void Fit_UnitReseatedHalfway_FlagsDisturbance()
    {
        // [common practice] a unit taken out and put back (inserted late) restarts its approach from room temperature:
        // the residuals of one follower curve through both halves come in long same-sign runs (NIST/SEMATECH §1.3.5.13).
        var noise = new Normal(0, 0.005, new Random(8));
        var readings = Readings(t => t < 80 ? ClosedForm(t, 48) : ClosedForm(t - 80, 48, 23), 0, 160, noise);

        var fit = FollowerApproachFit.Fit(readings, LeaderTau);

        Assert.True(!fit.Converged || fit.Disturbed, $"{fit.Why}, runs z {fit.RunsZScore}");
    }

    [Fact]
    public void Fit_TooFewReadings_SaysWhy()
    {
        var fit = FollowerApproachFit.Fit(Readings(t => ClosedForm(t, 48), 0, 10, null), LeaderTau);

        Assert.False(fit.Converged);
        Assert.Contains("at least 7", fit.Why, StringComparison.Ordinal);
    }

    [Fact]
    public void Phi_EqualTimeConstants_IsTheLimitTimesExponential()
    {
        // [derived] (exp(−t/τ) − exp(−t/τ_L))/(1/τ_L − 1/τ) → t·exp(−t/τ_L) as τ → τ_L (L'Hôpital).
        Assert.Equal(30 * Math.Exp(-30.0 / 40), FollowerApproachFit.Phi(30, 40, 40), 12);
        Assert.Equal(FollowerApproachFit.Phi(30, 40, 40), FollowerApproachFit.Phi(30, 40 * (1 + 1e-9), 40), 9);
        Assert.Equal((Math.Exp(-30.0 / 50) - Math.Exp(-30.0 / 40)) / ((1 / 40.0) - (1 / 50.0)), FollowerApproachFit.Phi(30, 50, 40), 12);
    }

    private static double ClosedForm(double t, double tau, double start = UnitStartC)
    {
        if (Math.Abs(tau - LeaderTau) < 1e-9)
        {
            return LeaderFinalC + ((start - LeaderFinalC + (LeaderAmplitudeC * t / tau)) * Math.Exp(-t / tau));
        }

        var k = LeaderAmplitudeC * LeaderTau / (LeaderTau - tau);
        return LeaderFinalC + (k * Math.Exp(-t / LeaderTau)) + ((start - LeaderFinalC - k) * Math.Exp(-t / tau));
    }

    private static List<(double Seconds, double Value)> Readings(Func<double, double> curve, double from, double to, Normal? noise)
    {
        var readings = new List<(double, double)>();
        for (var t = from; t <= to + 1e-9; t += IntervalSeconds)
        {
            readings.Add((t, curve(t) + (noise?.Sample() ?? 0)));
        }

        return readings;
    }
}
