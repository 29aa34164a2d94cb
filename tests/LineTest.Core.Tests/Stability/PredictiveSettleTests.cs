using LineTest.Core.Stability;

namespace LineTest.Core.Tests.Stability;

public sealed class PredictiveSettleTests
{
    // The demo sequence's bounds: offset from the setpoint at most 1 °C; a prediction taken at u(y∞) ≤ 0.01 °C.
    private const double SetpointC = 50;
    private const double MaxOffsetC = 1.0;
    private const double MaxUncertaintyC = 0.01;

    private static readonly ExponentialApproachResult GoodFit = new(
        Converged: true, FinalValue: 50.2, FinalValueStandardUncertainty: 0.005, Amplitude: -30, TimeConstantSeconds: 40,
        TimeConstantStandardUncertainty: 0.5, ResidualRms: 0.01, Readings: 40, RunsZScore: 0.3, Disturbed: false, Why: "converged");

    [Fact]
    public void Decide_CertainPredictionInsideTheBand_Takes()
    {
        var decision = PredictiveSettle.Decide(GoodFit, 80, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.Take, decision.Outcome);
        Assert.Equal("predictive", decision.Why);
    }

    [Fact]
    public void Decide_UncertaintyAboveTheLimit_KeepsWaiting()
    {
        var decision = PredictiveSettle.Decide(GoodFit with { FinalValueStandardUncertainty = 0.011 }, 80, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, decision.Outcome);
    }

    [Fact]
    public void Decide_ReadingsSpanLessThanOneTimeConstant_KeepsWaiting()
    {
        var decision = PredictiveSettle.Decide(GoodFit, 39, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, decision.Outcome);
        Assert.Contains("less than one time constant", decision.Why);
    }

    [Fact]
    public void Decide_NoFitYet_KeepsWaitingAndSaysWhy()
    {
        var fit = ExponentialApproachFit.Fit([(0, 20), (2, 21)]);

        var decision = PredictiveSettle.Decide(fit, 2, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, decision.Outcome);
        Assert.Equal("no fit yet: only 2 readings; a fit needs at least 6", decision.Why);
    }

    [Fact]
    public void Decide_Disturbance_FallsBack()
    {
        var decision = PredictiveSettle.Decide(GoodFit with { Disturbed = true, RunsZScore = -4.2 }, 80, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.FallBack, decision.Outcome);
        Assert.StartsWith("disturbance", decision.Why);
    }

    [Fact]
    public void Decide_CertainPredictionOutsideTheBand_FallsBack()
    {
        var decision = PredictiveSettle.Decide(GoodFit with { FinalValue = 51.2 }, 80, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.FallBack, decision.Outcome);
        Assert.Equal("predicted 51.2 °C, more than 1 °C from the setpoint", decision.Why);
    }

    [Fact]
    public void Decide_UncertainPredictionOutsideTheBand_KeepsWaiting()
    {
        var decision = PredictiveSettle.Decide(GoodFit with { FinalValue = 51.2, FinalValueStandardUncertainty = 0.5 }, 80, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, decision.Outcome);
    }

    [Fact]
    public void Decide_OnARealFitOfAnUndisturbedApproach_Takes()
    {
        // End to end over the fit: 90 s of a τ = 40 s approach to 50.2 °C, σ = 0.005 °C, fixed seed.
        var noise = new MathNet.Numerics.Distributions.Normal(0, 0.005, new Random(5));
        var readings = Enumerable.Range(0, 46).Select(i => (i * 2.0, 50.2 - (30 * Math.Exp(-i * 2.0 / 40)) + noise.Sample())).ToList();

        var decision = PredictiveSettle.Decide(ExponentialApproachFit.Fit(readings), 90, SetpointC, MaxOffsetC, MaxUncertaintyC);

        Assert.Equal(PredictiveSettleOutcome.Take, decision.Outcome);
        Assert.Equal(50.2, decision.Fit.FinalValue, 0.02);
    }
}
