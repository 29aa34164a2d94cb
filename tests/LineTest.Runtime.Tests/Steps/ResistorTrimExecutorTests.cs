using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

public sealed class ResistorTrimExecutorTests
{
    [Fact]
    public async Task RunAsync_GoodUnits_PassWithPartsChosenPromptedAndFitted()
    {
        var h = new CoordinatorHarness(seed: 21, sequenceFile: CoordinatorHarness.ResistorSequence);
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Null(outcome.Aborted);
        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
        foreach (var run in outcome.Runs)
        {
            Assert.Equal("resistor", run.Trim!.Method);
            Assert.True(run.Trim.Values.ContainsKey("R7") && run.Trim.Values.ContainsKey("R8"));
            Assert.Contains(run.Readings, r => r.Name == "trim.predicted.verify.worstCase" && r.Value >= 0);
            Assert.Contains(run.Readings, r => r.Name == "trim.R7.ideal" && r.Low == 2000 && r.High == 100000);
            Assert.Contains(run.Readings, r => r.Name == "trim.fitted" && r.Verdict == Verdict.Pass);
        }

        // One prompt per unit; the parts really went into the simulated units (no longer the calibration parts).
        Assert.Equal(3, h.Operator.Prompts.Count);
        Assert.All(units, u => Assert.NotEqual(h.Design.GainFittedOhms, u.FittedOhms["R7"]));
    }

    /// <summary>
    /// Three calibration points with the parts fitted at the inner one (+5 °C, also the verify setpoint): the units pass,
    /// the trim records each unit's curvature, and verify reads the unit with its new parts, not its calibration parts —
    /// its mean over the units within 0.05 °C of the minimax line's predicted error there.
    /// </summary>
    [Fact]
    public async Task RunAsync_ThreeCalibrationPoints_PassAndVerifyReadsTheFittedParts()
    {
        var h = new CoordinatorHarness(seed: 5, sequenceFile: "sequences/ctp40r-resistor-3pt.json");
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
        Assert.All(outcome.Runs, r => Assert.Contains(r.Readings, x => x.Name == "trim.model.curvature"));
        var verify = outcome.Runs.Average(r => r.Readings.Single(x => x.Name == "verify.error").Value!.Value);
        var predicted = outcome.Runs.Average(r => r.Readings.Single(x => x.Name == "trim.predicted.verify").Value!.Value);
        Assert.InRange(verify - predicted, -0.05, 0.05);
        Assert.InRange(predicted, -0.2, -0.03);
        // The prediction at the inner point carries the budget's uncertainty, fitted-part tolerance included (0.1 % parts
        // move the output by a few hundredths of a degree).
        Assert.All(outcome.Runs, r => Assert.InRange(r.Readings.Single(x => x.Name == "trim.predicted.verify").StandardUncertainty ?? 0, 0.01, 0.1));
    }

    [Fact]
    public async Task RunAsync_GoodUnit_PromptNamesSlotSerialValuesAndPositions()
    {
        var h = new CoordinatorHarness(seed: 22, sequenceFile: CoordinatorHarness.ResistorSequence);
        var units = h.Load(UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var run = outcome.Runs.Single(r => r.Slot == 2);
        var prompt = Assert.Single(h.Operator.Prompts, p => p.StartsWith("Slot 2 ", StringComparison.Ordinal));
        Assert.StartsWith($"Slot 2 ({units[1].Serial}): Fit ", prompt, StringComparison.Ordinal);
        Assert.EndsWith(", then press Enter", prompt, StringComparison.Ordinal);
        Assert.Contains("in position R7", prompt, StringComparison.Ordinal);
        Assert.Contains("in position R8", prompt, StringComparison.Ordinal);
        Assert.Contains("(E96)", prompt, StringComparison.Ordinal);
        Assert.Contains("kΩ", prompt, StringComparison.Ordinal);
        Assert.All(run.Trim!.Instructions, i => Assert.Contains(i["Fit ".Length..], prompt, StringComparison.Ordinal));
    }

    [Fact]
    public async Task RunAsync_OpenSensor_FailsAtCalibrationOutputLimitWithoutPrompt()
    {
        var h = new CoordinatorHarness(seed: 23, sequenceFile: CoordinatorHarness.ResistorSequence);
        var units = h.Load(UnitDefect.OpenSensor, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var open = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Fail, open.Verdict);
        Assert.Equal("cal-low.output", open.FirstFailingReading);
        Assert.DoesNotContain(h.Operator.Prompts, p => p.StartsWith("Slot 1 ", StringComparison.Ordinal));
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 2).Verdict);
    }

    [Fact]
    public async Task RunAsync_BadJointLeavesGainOpen_FailsVerify()
    {
        var h = new CoordinatorHarness(seed: 24, sequenceFile: CoordinatorHarness.ResistorSequence);
        var units = h.Load(UnitDefect.StuckDac);

        var outcome = await h.RunAsync(units);

        Assert.Null(units[0].FittedOhms["R7"]);
        Assert.Equal(Verdict.Fail, outcome.Runs[0].Verdict);
        Assert.Equal("verify.error", outcome.Runs[0].FirstFailingReading);
    }

    [Fact]
    public async Task RunAsync_SilentUnit_ErrorsAtIdentify()
    {
        var h = new CoordinatorHarness(seed: 25, sequenceFile: CoordinatorHarness.ResistorSequence);
        var units = h.Load(UnitDefect.Silent, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var silent = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Error, silent.Verdict);
        Assert.Contains("does not answer", silent.Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 2).Verdict);
    }

    [Fact]
    public async Task RunAsync_GainPositionRangeTooNarrow_FailsTrimOutOfRangeWithoutPrompt()
    {
        // Every unit needs Rg ≈ 8…12 kΩ; a position limited to 20…100 kΩ cannot give that gain.
        var h = new CoordinatorHarness(seed: 26, sequenceFile: CoordinatorHarness.ResistorSequence, editSequence: s => s with
        {
            Trim = s.Trim! with { Resistor = s.Trim.Resistor! with { Gain = s.Trim.Resistor.Gain with { MinOhms = 20_000 } } },
        });
        var units = h.Load(UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.Equal(Verdict.Fail, outcome.Runs[0].Verdict);
        Assert.Equal("trim.R7.ideal", outcome.Runs[0].FirstFailingReading);
        Assert.Empty(h.Operator.Prompts);
        Assert.False(outcome.Runs[0].Trim!.InRange);
    }
}
