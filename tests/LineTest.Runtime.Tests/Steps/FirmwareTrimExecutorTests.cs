using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

public sealed class FirmwareTrimExecutorTests
{
    [Fact]
    public async Task RunAsync_GoodUnits_PassWithCoefficientsStoredInTheUnit()
    {
        var h = new CoordinatorHarness(seed: 31, sequenceFile: CoordinatorHarness.FirmwareSequence);
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
        foreach (var (run, unit) in outcome.Runs.OrderBy(r => r.Slot).Zip(units))
        {
            Assert.Equal("firmware", run.Trim!.Method);
            Assert.Equal(run.Trim.Values["C0"], unit.StoredRegisters["C0"]);
            Assert.Equal(run.Trim.Values["C1"], unit.StoredRegisters["C1"]);

            // Calibration read the raw counts over the link, verify the unit's own temperature.
            Assert.Contains(run.Readings, r => r.Name == "cal-low.output" && r.Unit == "count" && r.Value > 500_000);
            Assert.Contains(run.Readings, r => r.Name == "verify.error" && r.Unit == "degC" && r.ExpandedUncertainty > 0);
        }

        Assert.Empty(h.Operator.Prompts);
    }

    [Fact]
    public async Task RunAsync_StoreDoesNotPersist_ErrorsNamingTheRegister()
    {
        var h = new CoordinatorHarness(seed: 32, sequenceFile: CoordinatorHarness.FirmwareSequence);
        var units = h.Load(UnitDefect.StuckDac, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var stuck = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Error, stuck.Verdict);
        Assert.Contains("read-back differs in slot 1", stuck.Reason, StringComparison.Ordinal);
        Assert.Contains("register C0 read back", stuck.Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 2).Verdict);
    }

    [Fact]
    public async Task RunAsync_OpenSensor_FailsAtCalibrationCountLimit()
    {
        var h = new CoordinatorHarness(seed: 33, sequenceFile: CoordinatorHarness.FirmwareSequence);
        var units = h.Load(UnitDefect.OpenSensor);

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Fail, outcome.Runs[0].Verdict);
        Assert.Equal("cal-low.output", outcome.Runs[0].FirstFailingReading);
        Assert.Contains("count", outcome.Runs[0].Reason, StringComparison.Ordinal);
    }

    [Fact]
    public async Task RunAsync_SilentUnit_ErrorsAtIdentifyAndOthersPass()
    {
        var h = new CoordinatorHarness(seed: 34, sequenceFile: CoordinatorHarness.FirmwareSequence);
        var units = h.Load(UnitDefect.None, UnitDefect.Silent);

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Error, outcome.Runs.Single(r => r.Slot == 2).Verdict);
        Assert.Contains("does not answer", outcome.Runs.Single(r => r.Slot == 2).Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 1).Verdict);
    }

    [Fact]
    public async Task RunAsync_LinkGoesSilentWhileMeasuring_OnlyThatUnitErrors()
    {
        var h = new CoordinatorHarness(seed: 35, sequenceFile: CoordinatorHarness.FirmwareSequence);
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        // Identify is one command; the soak at cal-low reads the link many times more: the fault lands in soak or measure.
        h.Rig.InjectFault(RigFault.UnitSilent(slot: 2, afterCommands: 5));

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        var lost = outcome.Runs.Single(r => r.Slot == 2);
        Assert.Equal(Verdict.Error, lost.Verdict);
        Assert.Contains("does not answer", lost.Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 1).Verdict);
    }
}
