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
