using LineTest.Core.Decisions;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

/// <summary>
/// Predictive settle over the simulated rig: the readings are taken from the fitted approach without a soak, and a
/// disturbed approach (the door opened, a unit inserted late) falls back to the window and says why.
/// </summary>
public sealed class PredictiveSettleRunnerTests
{
    private static readonly Func<SequenceDefinition, SequenceDefinition> Predictive =
        s => SettleSettings.ForAll(s, new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 });

    // A limit the fits only reach late, so that a disturbance at 380 s meets established fits whose readings are not
    // taken yet (with 0.01 °C they are taken near 380 s; a disturbance before a fit is established is only a ramp
    // that has not ended, and the fit waits until it has slid past it).
    private static readonly Func<SequenceDefinition, SequenceDefinition> PredictiveLate =
        s => SettleSettings.ForAll(s, new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.002 });

    [Fact]
    public async Task RunAsync_UndisturbedApproach_TakesTheReadingsWithoutSoakAndRecordsPredictive()
    {
        var h = new CoordinatorHarness(editSequence: Predictive);
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        Assert.All(outcome.Setpoints, s => Assert.Equal(0, s.SoakSeconds));
        foreach (var run in outcome.Runs)
        {
            Assert.Equal(Verdict.Pass, run.Verdict);
            foreach (var setpoint in outcome.Setpoints)
            {
                var mode = run.Readings.Single(r => r.Name == SettleModeCodes.ModeReading(setpoint.Name));
                Assert.Equal(SettleModeCodes.Predictive, mode.Value);
                Assert.Equal("predictive", mode.Note);
                Assert.InRange(run.Readings.Single(r => r.Name == SettleModeCodes.ResidualReading(setpoint.Name)).Value!.Value, 0, 0.02);
                Assert.InRange(run.Readings.Single(r => r.Name == SettleModeCodes.ReferenceResidualReading(setpoint.Name)).Value!.Value, 0, 0.02);
            }
        }
    }

    [Fact]
    public async Task RunAsync_Predictive_VerifyUncertaintyCarriesTheExtrapolationSoTheGuardBandWidens()
    {
        // ILAC G8:09/2019 §4.2 guarded acceptance: the acceptance limits move in by U; the predictive reading's U holds
        // the extrapolations of the reference and the unit as lines of its budget (JCGM 100:2008 §5.1.2), so with the
        // same units its acceptance interval is narrower than the window mode's by at least their quadrature sum.
        var window = new CoordinatorHarness();
        var predictive = new CoordinatorHarness(editSequence: Predictive);
        var windowRuns = (await window.RunAsync(window.Load(UnitDefect.None))).Runs;
        var predictiveRuns = (await predictive.RunAsync(predictive.Load(UnitDefect.None))).Runs;

        var w = windowRuns.Single().Readings.Single(r => r.Name == "verify.error");
        var p = predictiveRuns.Single().Readings.Single(r => r.Name == "verify.error");

        Assert.Equal("guarded", p.DecisionRule);
        Assert.True(p.ExpandedUncertainty > w.ExpandedUncertainty, $"predictive U {p.ExpandedUncertainty}, window U {w.ExpandedUncertainty}");
        Assert.Equal(p.High!.Value - p.ExpandedUncertainty!.Value, p.AcceptanceHigh!.Value, 9);
        Assert.True(p.AcceptanceHigh < w.AcceptanceHigh);
    }

    [Fact]
    public async Task RunAsync_DoorOpenedDuringTheApproach_FallsBackToTheWindowAndSaysWhy()
    {
        // The door of the block opened 380 s after the first setpoint (−20 °C from the 23 °C standby: ramp until about
        // 218 s) pulls the block towards room temperature for 20 s.
        SimulatedRig? rig = null;
        var h = new CoordinatorHarness(editSequence: PredictiveLate, instruments: r =>
        {
            rig = r;
            return r.Instruments with { Reference = new ActingReference(r.Instruments.Reference, r.TimeProvider, Door(r)) };
        });
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.NotNull(rig);
        Assert.Null(outcome.Aborted);
        var first = outcome.Setpoints[0];
        Assert.Equal("cal-low", first.Name);
        Assert.True(first.SoakSeconds > 0, "a fallback soaks as in window mode");
        foreach (var run in outcome.Runs)
        {
            var mode = run.Readings.Single(r => r.Name == SettleModeCodes.ModeReading("cal-low"));
            Assert.Equal(SettleModeCodes.WindowFallback, mode.Value);
            Assert.StartsWith("window-fallback: ", mode.Note, StringComparison.Ordinal);
            Assert.Contains("disturbance", mode.Note, StringComparison.Ordinal);
            Assert.Equal(Verdict.Pass, run.Verdict);
        }
    }

    [Fact]
    public async Task RunAsync_UnitInsertedLate_FallsBackNamingTheSlot()
    {
        // Slot 2's unit is taken out and put back 380 s into the approach to −20 °C: its sensor starts again from room
        // temperature, which its own fit cannot follow.
        var h = new CoordinatorHarness(editSequence: PredictiveLate, instruments: r =>
            r.Instruments with { Reference = new ActingReference(r.Instruments.Reference, r.TimeProvider, Reseat(r, 2)) });
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        var notes = outcome.Runs.Select(r => r.Readings.Single(x => x.Name == SettleModeCodes.ModeReading("cal-low")).Note!).ToList();
        Assert.All(notes, n => Assert.StartsWith("window-fallback: slot 2: disturbance", n, StringComparison.Ordinal));
        Assert.True(outcome.Setpoints[0].SoakSeconds > 0);
    }

    /// <summary>Between 380 and 400 s after the start the block is told to go to room temperature, then back to its setpoint.</summary>
    private static List<(double AtSeconds, Action Act)> Door(SimulatedRig rig)
    {
        var setpoint = double.NaN;
        return
        [
            (380, () =>
            {
                setpoint = rig.Block.SetpointC;
                rig.Block.SetSetpointAsync(SimulatedRig.DefaultAmbientC, CancellationToken.None).GetAwaiter().GetResult();
            }),
            (400, () => rig.Block.SetSetpointAsync(setpoint, CancellationToken.None).GetAwaiter().GetResult()),
        ];
    }

    private static List<(double AtSeconds, Action Act)> Reseat(SimulatedRig rig, int slot) =>
    [
        (380, () => rig.Load(slot, rig.Unload(slot)!)),
    ];

    /// <summary>A reference readout that, on its first read after each given time (seconds from its creation), acts on the rig.</summary>
    private sealed class ActingReference(IReferenceReadout inner, TimeProvider clock, List<(double AtSeconds, Action Act)> acts) : IReferenceReadout
    {
        private readonly DateTimeOffset _start = clock.GetUtcNow();
        private int _next;

        public Task<double> ReadRawAsync(CancellationToken cancellationToken)
        {
            while (_next < acts.Count && (clock.GetUtcNow() - _start).TotalSeconds >= acts[_next].AtSeconds)
            {
                acts[_next++].Act();
            }

            return inner.ReadRawAsync(cancellationToken);
        }
    }
}
