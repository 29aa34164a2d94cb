using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Tests.Batches;

public sealed class BatchCoordinatorScheduleTests
{
    private static readonly Func<SequenceDefinition, SequenceDefinition> Free = s => s with { SetpointOrder = SetpointOrders.Free };

    [Fact]
    public async Task RunAsync_FreeOrderFromStandby_VisitsCalHighFirstAndAllPass()
    {
        var h = new CoordinatorHarness(editSequence: Free, sequenceFile: "sequences/ctp40r-resistor.json");
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        // From the 23 °C standby, +40 °C first is the shorter travel (see SetpointPlanTests); verify stays after the trim.
        Assert.Null(outcome.Aborted);
        Assert.Equal(["cal-high", "cal-low", "verify"], outcome.Setpoints.Select(s => s.Name));
        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
    }

    [Fact]
    public async Task RunAsync_FastSchedule_CommandsTheFirstSetpointBeforeIdentifying()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var first = outcome.Setpoints[0];
        var commanded = first.StableAt!.Value - TimeSpan.FromSeconds(first.SecondsToStable);
        Assert.Equal(outcome.Started, commanded);
        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
    }

    [Fact]
    public async Task RunAsync_BaselineSchedule_FixedWaitsInFileOrder()
    {
        var h = new CoordinatorHarness(editSequence: Free);
        var units = h.Load(UnitDefect.None);
        var baseline = BatchSchedule.Baseline(h.Sequence, h.Fixture.Source);

        var outcome = await h.Coordinator.RunAsync(h.Request(units) with { Schedule = baseline }, CancellationToken.None);

        Assert.Null(outcome.Aborted);
        Assert.Equal(["cal-low", "cal-high", "verify"], outcome.Setpoints.Select(s => s.Name));
        Assert.All(outcome.Setpoints, s => Assert.Equal(baseline.FixedSettleSeconds, s.SecondsToStable, 6));
        Assert.All(outcome.Setpoints, s => Assert.Equal(baseline.FixedSoakSeconds, s.SoakSeconds));

        // Not commanded ahead: identify and the supply check ran first.
        var first = outcome.Setpoints[0];
        Assert.True(first.StableAt!.Value - TimeSpan.FromSeconds(first.SecondsToStable) > outcome.Started);
        Assert.Equal(Verdict.Pass, Assert.Single(outcome.Runs).Verdict);
    }

    [Fact]
    public async Task RunAsync_BaselineTooShortToReachTheSetpoint_StopsTheBatchWithoutMeasuring()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None);
        var tooShort = new BatchSchedule(BatchScheduleKind.Baseline, FixedSettleSeconds: 60, FixedSoakSeconds: 10);

        var outcome = await h.Coordinator.RunAsync(h.Request(units) with { Schedule = tooShort }, CancellationToken.None);

        Assert.NotNull(outcome.Aborted);
        Assert.Contains("after the fixed settle of 60 s", outcome.Aborted, StringComparison.Ordinal);
        var run = Assert.Single(outcome.Runs);
        Assert.Equal(Verdict.Error, run.Verdict);
        Assert.DoesNotContain(run.Readings, r => r.Setpoint == "cal-low");
    }

    [Theory]
    [InlineData(CoordinatorHarness.DacSequence)]
    [InlineData(CoordinatorHarness.FirmwareSequence)]
    public async Task RunAsync_SameUnitsBaselineAndFast_SameVerdictsAndAgreeingVerifyErrors(string sequenceFile)
    {
        // The same eight units (same seed, same defects, same slots) judged one at a time on fixed waits and four at a
        // time on the fast schedule with free order: the verdicts must be the same, and the verify errors of each unit
        // must agree, once the difference their trims predict is taken out, within the expanded uncertainties the two runs claim (JCGM 100:2008 §6: two results of one
        // measurand agree when their difference is within the combined expanded uncertainty).
        UnitDefect[] defects = [UnitDefect.None, UnitDefect.None, UnitDefect.OpenSensor, UnitDefect.None,
            UnitDefect.None, UnitDefect.Silent, UnitDefect.None, UnitDefect.None];
        var fast = new CoordinatorHarness(seed: 21, editSequence: Free, sequenceFile: sequenceFile);
        var slow = new CoordinatorHarness(seed: 21, editSequence: Free, sequenceFile: sequenceFile);
        var baseline = BatchSchedule.Baseline(slow.Sequence, slow.Fixture.Source);
        var fastUnits = defects.Select(d => fast.Factory.NextUnit(d)).ToList();
        var slowUnits = defects.Select(d => slow.Factory.NextUnit(d)).ToList();
        Assert.Equal(fastUnits.Select(u => u.Serial), slowUnits.Select(u => u.Serial));

        for (var b = 0; b < 2; b++)
        {
            var batch = fastUnits.Skip(b * 4).Take(4).ToList();
            for (var i = 0; i < batch.Count; i++)
            {
                fast.Rig.Load(i + 1, batch[i]);
            }

            await fast.Coordinator.RunAsync(fast.Request(batch), CancellationToken.None);
            for (var i = 0; i < batch.Count; i++)
            {
                fast.Rig.Unload(i + 1);
            }
        }

        for (var k = 0; k < slowUnits.Count; k++)
        {
            var slot = k % 4 + 1;
            slow.Rig.Load(slot, slowUnits[k]);
            var request = slow.Request([slowUnits[k]]) with { Loads = [new SlotLoad(slot, slowUnits[k].Serial)], Schedule = baseline };
            await slow.Coordinator.RunAsync(request, CancellationToken.None);
            slow.Rig.Unload(slot);
        }

        Assert.Equal(8, fast.Stored.Count);
        Assert.Equal(8, slow.Stored.Count);
        foreach (var serial in fastUnits.Select(u => u.Serial))
        {
            var a = fast.Stored.Single(r => r.Serial == serial);
            var b = slow.Stored.Single(r => r.Serial == serial);
            Assert.Equal(b.Verdict, a.Verdict);
            Assert.Equal(b.Slot, a.Slot);
            if (a.Verdict != Verdict.Pass)
            {
                continue;
            }

            // Two runs may land one trim code apart (noise near a rounding boundary; one offset code is 0.05 °C here),
            // so the measured verify errors may differ by what the trims themselves predict, and by no more than that
            // plus the two expanded uncertainties.
            var ea = a.Readings.Single(r => r.Name == "verify.error");
            var eb = b.Readings.Single(r => r.Name == "verify.error");
            var pa = a.Trim!.PredictedErrorC["verify"];
            var pb = b.Trim!.PredictedErrorC["verify"];
            var unexplained = (ea.Value!.Value - eb.Value!.Value) - (pa - pb);
            Assert.InRange(Math.Abs(unexplained), 0, ea.ExpandedUncertainty!.Value + eb.ExpandedUncertainty!.Value);
        }

        Assert.Contains(fast.Stored, r => r.Verdict == Verdict.Pass);
        Assert.Contains(fast.Stored, r => r.Verdict != Verdict.Pass);
    }
}
