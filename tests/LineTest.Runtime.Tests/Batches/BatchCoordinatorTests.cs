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
    public async Task RunAsync_OpenSensor_FailsAtTheSweepsCompliance()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.OpenSensor, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        // The demo sequence sweeps the sensor before it calibrates: the open sensor drives the SMU into compliance.
        var open = outcome.Runs.Single(r => r.Slot == 1);
        Assert.Equal(Verdict.Fail, open.Verdict);
        Assert.Equal("iv-low.fit", open.FirstFailingReading);
        Assert.Contains("open sensor", open.Reason, StringComparison.Ordinal);
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

    public static TheoryData<string> TrimSequences => new(CoordinatorHarness.DacSequence, CoordinatorHarness.ResistorSequence, CoordinatorHarness.FirmwareSequence);

    /// <summary>
    /// Property: for many good simulated units, the error each trim predicts is the error the trimmed unit really has
    /// (simulator ground truth, noise-free, sensor settled), at each calibration setpoint and at the verify setpoint.
    /// </summary>
    /// <remarks>
    /// The demo sequences state the diode's temperature model, so the prediction at the verify setpoint includes the
    /// diode's curvature between the calibration setpoints (about −0.2 °C at +5 °C for a line through the points) and is
    /// compared with the true error directly; the curvature itself is still bounded on its own. Allowance 0.06 °C: after the soak a
    /// unit may still lag its well by drift × time constant ≈ 0.05 °C/min × 40 s ≈ 0.03 °C, a well sits up to 0.02 °C
    /// from the reference well, and 10 averaged samples leave about 0.005 °C of noise. For resistors the predicted worst
    /// case over part tolerance (minus the nominal error) is added, as fitted parts are drawn within that tolerance.
    /// </remarks>
    [Theory]
    [MemberData(nameof(TrimSequences))]
    public async Task RunAsync_ManyRandomGoodUnits_TrueErrorWithinPredictedResidual(string sequenceFile)
    {
        const double AllowanceC = 0.06;
        const double MaxCurvatureC = 0.35;
        var h = new CoordinatorHarness(seed: 4242, sequenceFile: sequenceFile);
        var setpoints = h.Sequence.Setpoints.ToDictionary(s => s.Name, s => s.Celsius);
        var target = h.Sequence.Trim!.AnalogTarget;
        var checkedUnits = 0;
        for (var batch = 0; batch < 10; batch++)
        {
            var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);
            var outcome = await h.RunAsync(units);
            foreach (var unit in units)
            {
                h.Rig.Unload(units.IndexOf(unit) + 1);
                var run = outcome.Runs.Single(r => r.Serial == unit.Serial);
                Assert.True(run.Trim is { InRange: true }, $"{unit.Serial}: {run.Reason}");
                double TrueErrorC(double celsius) => target is null ? unit.TrueReportedErrorC(celsius) : unit.TrueErrorC(target, celsius);
                double Extra(string name) => run.Trim.PredictedErrorC.TryGetValue($"{name}.worstCase", out var worst)
                    ? worst - Math.Abs(run.Trim.PredictedErrorC[name])
                    : run.Trim.Method == "dac" ? DacStepExtraC(h, run, setpoints[name]) : 0;

                var low = setpoints["cal-low"];
                var high = setpoints["cal-high"];
                var check = setpoints["verify"];
                foreach (var name in new[] { "cal-low", "cal-high" })
                {
                    var miss = TrueErrorC(setpoints[name]) - run.Trim.PredictedErrorC[name];
                    Assert.True(Math.Abs(miss) <= AllowanceC + Extra(name), $"{unit.Serial} at {name}: true − predicted = {miss} °C");
                }

                var chord = TrueErrorC(low) + ((TrueErrorC(high) - TrueErrorC(low)) * (check - low) / (high - low));
                var curvature = TrueErrorC(check) - chord;
                Assert.InRange(curvature, -MaxCurvatureC, MaxCurvatureC);
                var verifyMiss = TrueErrorC(check) - run.Trim.PredictedErrorC["verify"];
                Assert.True(Math.Abs(verifyMiss) <= AllowanceC + Extra("verify"), $"{unit.Serial} at verify: true − predicted = {verifyMiss} °C");
                checkedUnits++;
            }
        }

        Assert.Equal(40, checkedUnits);
    }

    /// <summary>
    /// The DAC trim computes codes with the declared steps, while each part's DACs are drawn within ±2σ of them
    /// (<see cref="SimulatedUnitDesign.DacStepSpread"/>): the error that can leave at temperature <paramref name="celsius"/>, °C.
    /// </summary>
    private static double DacStepExtraC(CoordinatorHarness h, RunRecord run, double celsius)
    {
        var d = h.Design;
        var spread = 2 * d.DacStepSpread;
        var gainCodes = Math.Abs(run.Trim!.Values["gainCode"] - d.CodeNominal);
        var offsetCodes = Math.Abs(run.Trim.Values["offsetCode"] - d.CodeNominal);
        var volts = Math.Abs(d.Target.VoltsAt(celsius));
        return spread * ((offsetCodes * d.OffsetStepVolts) + (gainCodes * d.GainStepPerCode * volts)) / d.TargetSlopeVoltsPerC;
    }

    private sealed class FailingSink : IRunSink
    {
        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken) =>
            throw new IOException("disk full");
    }
}
