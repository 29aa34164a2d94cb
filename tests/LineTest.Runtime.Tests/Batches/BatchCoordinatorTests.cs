using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Tests.Batches;

public sealed class BatchCoordinatorTests
{
    [Fact]
    public async Task RunAsync_FourGoodUnits_AllPassAndEachRunIsStoredOnce()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
        Assert.Equal(units.Select(u => u.Serial).Order(), h.Stored.Select(r => r.Serial).Order());
        Assert.Equal(4, h.Stored.Select(r => r.Id).Distinct().Count());
        var run = h.Stored[0];
        Assert.Equal(["cal-low", "cal-high", "verify"], run.Setpoints.Select(s => s.Name));
        Assert.All(run.Setpoints, s => Assert.True(s.SecondsToStable > 0 && s.StableAt is not null));
        Assert.Contains(run.Readings, r => r.Name == "verify.error" && r.DecisionRule == "guarded" && r.ExpandedUncertainty > 0);
        Assert.NotNull(run.Trim);
        Assert.Equal("dac", run.Trim!.Method);
        Assert.Equal(h.Sha256, run.SequenceSha256);
    }

    [Fact]
    public async Task RunAsync_TrimmedGoodUnits_TrueErrorAtVerifyWithinLimit()
    {
        var h = new CoordinatorHarness(seed: 5);
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        await h.RunAsync(units);

        // The simulator knows each unit's true transfer: after the trim its error at +5 °C must be well inside ±0.5 °C.
        var target = h.Sequence.Trim!.Dac!.Target;
        Assert.All(units, u => Assert.InRange(u.TrueErrorC(target, 5.0), -0.5, 0.5));
    }

    [Fact]
    public async Task RunAsync_SilentUnit_ErrorsWithReasonAndOthersPass()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.Silent, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var silent = outcome.Runs.Single(r => r.Slot == 2);
        Assert.Equal(Verdict.Error, silent.Verdict);
        Assert.Contains("does not answer", silent.Reason, StringComparison.Ordinal);
        Assert.All(outcome.Runs.Where(r => r.Slot != 2), r => Assert.Equal(Verdict.Pass, r.Verdict));
    }

    [Fact]
    public async Task RunAsync_OpenSensor_FailsAtCalibrationOutputLimit()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.OpenSensor, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var open = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Fail, open.Verdict);
        Assert.Equal("cal-low.output", open.FirstFailingReading);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 2).Verdict);
    }

    [Fact]
    public async Task RunAsync_StuckDac_FailsVerify()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.StuckDac);

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Fail, outcome.Runs[0].Verdict);
        Assert.Equal("verify.error", outcome.Runs[0].FirstFailingReading);
    }

    [Fact]
    public async Task RunAsync_WrongSerialScanned_ErrorsNamingBothSerials()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None);
        var request = h.Request(units) with { Loads = [new SlotLoad(1, "CTP40A-2612-999999")] };

        var outcome = await h.Coordinator.RunAsync(request, default);

        Assert.Equal(Verdict.Error, outcome.Runs[0].Verdict);
        Assert.Contains(units[0].Serial, outcome.Runs[0].Reason, StringComparison.Ordinal);
        Assert.Contains("CTP40A-2612-999999", outcome.Runs[0].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public async Task RunAsync_MeterLostMidBatch_AllUnitsErrorAndSourceGoesToStandby()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.MeterSilent(afterCommands: 40));

        var outcome = await h.RunAsync(units);

        Assert.NotNull(outcome.Aborted);
        Assert.All(outcome.Runs, r =>
        {
            Assert.Equal(Verdict.Error, r.Verdict);
            Assert.Contains("voltmeter", r.Reason, StringComparison.Ordinal);
        });
        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
        Assert.Equal(2, h.Stored.Count);
    }

    [Fact]
    public async Task RunAsync_SourceHeaterFault_ErrorsNamingTheSourceAndStandby()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None);
        h.Rig.InjectFault(RigFault.SourceHeaterFault());

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Error, outcome.Runs[0].Verdict);
        Assert.Contains("temperature source", outcome.Runs[0].Reason, StringComparison.Ordinal);
        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
    }

    [Fact]
    public async Task RunAsync_ReferenceDriftsFasterThanTheLimit_ErrorsWithTimeoutReasonAndStandby()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None);

        // 6 °C/h = 0.1 °C/min, five times the sequence's drift limit: the source can never be judged stable.
        h.Rig.InjectFault(RigFault.ReferenceDrift(6));

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Error, outcome.Runs[0].Verdict);
        Assert.Contains("did not become stable", outcome.Runs[0].Reason, StringComparison.Ordinal);
        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
    }

    [Fact]
    public async Task RunAsync_Cancelled_UnitsErrorAsCancelledAndSourceGoesToStandby()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        using var cancel = new CancellationTokenSource();
        await cancel.CancelAsync();

        var outcome = await h.Coordinator.RunAsync(h.Request(units), cancel.Token);

        Assert.Equal("cancelled", outcome.Aborted);
        Assert.All(outcome.Runs, r =>
        {
            Assert.Equal(Verdict.Error, r.Verdict);
            Assert.Contains("cancelled", r.Reason, StringComparison.Ordinal);
        });
        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
    }

    [Fact]
    public async Task RunAsync_StoreFails_ThrowsRunStorageExceptionAndSendsStandby()
    {
        var h = new CoordinatorHarness(sink: new FailingSink());
        var units = h.Load(UnitDefect.Silent, UnitDefect.None);

        await Assert.ThrowsAsync<RunStorageException>(() => h.RunAsync(units));

        Assert.Equal(h.Fixture.Source.StandbyC, h.Rig.Block.SetpointC);
    }

    [Fact]
    public async Task RunAsync_SameSeed_SameVerdictsAndTrims()
    {
        static async Task<List<(string, Verdict, double?)>> Once()
        {
            var h = new CoordinatorHarness(seed: 99);
            var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.StuckDac, UnitDefect.None);
            var outcome = await h.RunAsync(units);
            return outcome.Runs.Select(r => (r.Serial, r.Verdict, r.Trim?.Values.Values.Sum())).ToList();
        }

        Assert.Equal(await Once(), await Once());
    }

    private sealed class FailingSink : IRunSink
    {
        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken) =>
            throw new IOException("disk full");
    }
}
