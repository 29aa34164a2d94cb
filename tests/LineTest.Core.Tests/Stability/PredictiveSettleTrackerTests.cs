using LineTest.Core.Stability;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Stability;

public sealed class PredictiveSettleTrackerTests
{
    // The demo source's shape [derived from the model ThermalBound.TravelSeconds states]: ramp at r = 10 °C/min from
    // 20 °C until the error is r·τ, then a first-order approach with τ = 40 s to 50 °C. Readings every 5 s with
    // σ = 0.005 °C (ten times the simulated readout's noise, to be conservative). The window mode's settings are the
    // demo sequence's: ±0.05 °C over 60 s, drift below 0.02 °C/min.
    private const double StartC = 20;
    private const double SetpointC = 50;
    private const double RatePerSecond = 10.0 / 60;
    private const double TauSeconds = 40;
    private const double IntervalSeconds = 5;
    private const double MaxUncertaintyC = 0.01;

    [Fact]
    public void Add_RampThenFirstOrderApproach_TakesBeforeTheStabilityWindowAndPredictsTheFinalValue()
    {
        var noise = new Normal(0, 0.005, new Random(2121));
        var tracker = new PredictiveSettleTracker(SetpointC, 1.0, MaxUncertaintyC, fitSpanSeconds: 120);
        var window = new StabilityWindow(60, 0.05, 0.02);
        double? takenAt = null, stableAt = null;
        PredictiveSettleDecision? taken = null;
        for (var t = 0.0; t <= 1200 && (takenAt is null || stableAt is null); t += IntervalSeconds)
        {
            var reading = Block(t) + noise.Sample();
            var decision = tracker.Add(t, reading);
            window.Add(t, reading);
            Assert.NotEqual(PredictiveSettleOutcome.FallBack, decision.Outcome);
            if (takenAt is null && decision.Outcome == PredictiveSettleOutcome.Take)
            {
                takenAt = t;
                taken = decision;
            }

            stableAt ??= window.Evaluate().IsStable ? t : null;
        }

        Assert.NotNull(takenAt);
        Assert.NotNull(stableAt);
        Assert.True(takenAt < stableAt, $"predictive took at {takenAt} s, the window was stable at {stableAt} s");
        Assert.True(takenAt > KneeSeconds, $"a prediction taken while still ramping ({takenAt} s, knee at {KneeSeconds} s)");
        Assert.InRange(taken!.Fit.FinalValue, SetpointC - (3 * taken.Fit.FinalValueStandardUncertainty), SetpointC + (3 * taken.Fit.FinalValueStandardUncertainty));
        Assert.True(taken.Fit.FinalValueStandardUncertainty <= MaxUncertaintyC);
    }

    [Fact]
    public void AddFollowing_UnitFollowingTheBlock_TakesAndPredictsTheWellTemperature()
    {
        // [derived] a unit with τ = 48 s following the block of the test above (closed form of a first-order lag of
        // the exponential part, the unit starting 3 °C behind the block at the knee), read every 2 s with σ = 0.005 °C;
        // its tracker waits for the block's fit, then takes with the well's final value inside 3 u.
        var noise = new Normal(0, 0.005, new Random(77));
        var block = new PredictiveSettleTracker(SetpointC, 1.0, MaxUncertaintyC, fitSpanSeconds: 160);
        var unit = new PredictiveSettleTracker(0, double.PositiveInfinity, MaxUncertaintyC, fitSpanSeconds: 160);
        var first = unit.AddFollowing(0, StartC, leader: null);
        PredictiveSettleDecision? taken = null;
        for (var t = KneeSeconds; t <= KneeSeconds + 600 && taken is null; t += 2)
        {
            block.Add(t, Block(t) + noise.Sample());
            var decision = unit.AddFollowing(t, Unit(t - KneeSeconds) + noise.Sample(), block.Last?.Fit);
            Assert.NotEqual(PredictiveSettleOutcome.FallBack, decision.Outcome);
            taken = decision.Outcome == PredictiveSettleOutcome.Take ? decision : null;
        }

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, first.Outcome);
        Assert.Contains("reference", first.Why, StringComparison.Ordinal);
        Assert.NotNull(taken);
        Assert.NotNull(taken.Fit.LeaderTimeConstantSeconds);
        var u = taken.Fit.FinalValueStandardUncertainty;
        Assert.InRange(taken.Fit.FinalValue, SetpointC - (3 * u) - 1e-3, SetpointC + (3 * u) + 1e-3);
        Assert.Equal(unit.PredictedAt(KneeSeconds + 10000), taken.Fit.FinalValue, 6);
    }

    private static double Unit(double sinceKnee)
    {
        const double tau = 48;
        var amplitude = -RatePerSecond * TauSeconds;
        var k = amplitude * TauSeconds / (TauSeconds - tau);
        var start = SetpointC + amplitude - 3;
        return SetpointC + (k * Math.Exp(-sinceKnee / TauSeconds)) + ((start - SetpointC - k) * Math.Exp(-sinceKnee / tau));
    }

    [Fact]
    public void Add_StepAfterAUsableFit_FallsBackAndStaysFallenBack()
    {
        // A tight limit so the tracker is still waiting (on u) when the step comes; the step is 0.3 °C at 60 s into
        // the tail, like a door opened on the block.
        var noise = new Normal(0, 0.005, new Random(2122));
        var tracker = new PredictiveSettleTracker(SetpointC, 1.0, 1e-6, fitSpanSeconds: 120);
        var sawUsable = false;
        PredictiveSettleDecision? last = null;
        for (var t = KneeSeconds; t <= KneeSeconds + 160; t += IntervalSeconds)
        {
            var step = t >= KneeSeconds + 90 ? -0.3 : 0;
            last = tracker.Add(t, Block(t) + step + noise.Sample());
            sawUsable |= t < KneeSeconds + 90 && last.Fit.IsUsable;
        }

        Assert.True(sawUsable, "the tail before the step must have given a usable fit");
        Assert.Equal(PredictiveSettleOutcome.FallBack, last!.Outcome);
        Assert.StartsWith("disturbance", last.Why);
        Assert.True(tracker.FellBack);
        Assert.Same(last, tracker.Add(KneeSeconds + 165, SetpointC));
    }

    [Fact]
    public void Add_MisfitWhileStillRamping_KeepsWaiting()
    {
        var tracker = new PredictiveSettleTracker(SetpointC, 1.0, MaxUncertaintyC, fitSpanSeconds: 120);
        PredictiveSettleDecision? decision = null;
        for (var t = 0.0; t <= KneeSeconds + 20; t += IntervalSeconds)
        {
            decision = tracker.Add(t, Block(t));
            Assert.NotEqual(PredictiveSettleOutcome.FallBack, decision.Outcome);
            Assert.NotEqual(PredictiveSettleOutcome.Take, decision.Outcome);
        }

        Assert.Equal(PredictiveSettleOutcome.KeepWaiting, decision!.Outcome);
    }

    private static double KneeSeconds => ((SetpointC - StartC) - (RatePerSecond * TauSeconds)) / RatePerSecond;

    private static double Block(double t) => t <= KneeSeconds
        ? StartC + (RatePerSecond * t)
        : SetpointC - (RatePerSecond * TauSeconds * Math.Exp(-(t - KneeSeconds) / TauSeconds));
}
