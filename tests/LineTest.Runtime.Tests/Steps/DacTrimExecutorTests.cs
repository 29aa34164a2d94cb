using LineTest.Core.Calibration;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Trims;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

public sealed class DacTrimExecutorTests
{
    /// <summary>
    /// Regression: the CTP-40A's real DACs step up to ±0.5 % away from their declared steps, so a unit whose offset code
    /// moved 250 codes from nominal landed up to 0.06 °C away from what its codes were meant to give. The miss measured
    /// here is that and only that: the unit's true error as shipped minus the error its stored codes give on the unit's
    /// true untrimmed curve with the declared steps, plus the output error the check measured (none without a check) — no
    /// lag, noise or model in it — at −20, +5 and +40 °C. With the check the same units (same seed) must miss by less.
    /// </summary>
    [Fact]
    public async Task RunAsync_DacCheck_TrueErrorNearerThePrediction()
    {
        var with = await MissesAsync(checkPairs: 2);
        var without = await MissesAsync(checkPairs: null);

        Assert.Equal(12, with.Units);
        Assert.True(with.Rms < 0.75 * without.Rms, $"true − predicted RMS {with.Rms:F4} °C with the check, {without.Rms:F4} °C without");
        Assert.True(with.Checked == with.Units, $"{with.Checked} of {with.Units} units checked");
    }

    [Fact]
    public async Task RunAsync_StuckDacChecked_CodesLeftForVerifyWhichFails()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.StuckDac);

        var outcome = await h.RunAsync(units);

        var run = Assert.Single(outcome.Runs);
        Assert.Equal(Verdict.Fail, run.Verdict);
        Assert.Equal("verify.error", run.FirstFailingReading);
        var check = run.Readings.Single(r => r.Name == "trim.check.residual");
        Assert.Contains("did not move", check.Note, StringComparison.Ordinal);
        Assert.Equal(run.Trim!.Inputs["computed.offsetCode"], run.Trim.Values["offsetCode"]);
    }

    /// <summary>
    /// The fixture's well offsets: a unit in a well δ warmer than the reference well reads, uncorrected, as if it were at
    /// the reference's temperature, so its trim leaves it reading δ low. Stating δ for the slot moves the unit's true error
    /// by +δ [derived], within the few thousandths of a degree that whole DAC codes allow.
    /// </summary>
    [Fact]
    public async Task RunAsync_SlotsStateTheirWellOffsets_TrueErrorMovesByThem()
    {
        var stated = await TrueErrorsAtVerifyAsync(f => f);
        var unstated = await TrueErrorsAtVerifyAsync(f => f with { Slots = f.Slots.Select(s => s with { WellOffsetC = null }).ToList() });
        var fixture = new CoordinatorHarness().Fixture;

        for (var slot = 1; slot <= 4; slot++)
        {
            var offset = fixture.WellOffsetC(slot);
            Assert.InRange(stated[slot] - unstated[slot], offset - 0.008, offset + 0.008);
        }
    }

    /// <summary>
    /// Three calibration points: the trim fits each unit's own curvature λ (its bow over the sensor model's) and records it
    /// with the inner point's residual from the nominal bow. The λ it records must be the one the unit's true untrimmed
    /// curve gives through the same temperatures, within what the points' noise and lag allow (a 0.01 °C error of the
    /// inner point is about 5 % of the 0.21 °C bow at +5 °C [derived]); the units' own λ spread over ±0.1 and more.
    /// </summary>
    [Fact]
    public async Task RunAsync_ThreeCalibrationPoints_RecordsEachUnitsOwnCurvature()
    {
        var h = new CoordinatorHarness(seed: 91, sequenceFile: "sequences/ctp40a-dac-3pt.json");
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var model = h.Sequence.Trim!.SensorModel!;
        foreach (var unit in units)
        {
            var run = outcome.Runs.Single(r => r.Serial == unit.Serial);
            Assert.Equal(Verdict.Pass, run.Verdict);
            var ideality = run.Readings.Where(r => r.Name is "iv-low.n" or "iv-high.n").Average(r => r.Value!.Value);
            var truth = SensorCurve.FitWithCurvature([.. new[] { -20.0, 5, 40 }.Select(c => new CalibrationPoint("t", c, unit.CalibrationOutputVolts(c)))], model, ideality).Value;
            var recorded = run.Readings.Single(r => r.Name == "trim.model.curvature").Value!.Value;
            Assert.InRange(recorded - truth.CurvatureScale, -0.06, 0.06);
            Assert.Contains(run.Readings, r => r.Name == "trim.model.residual.verify" && r.Unit == "degC");
        }
    }

    private static async Task<(int Units, int Checked, double Rms)> MissesAsync(int? checkPairs)
    {
        var h = new CoordinatorHarness(seed: 77, editSequence: s => s with { Trim = s.Trim! with { Dac = s.Trim.Dac! with { CheckPairs = checkPairs } } });
        var setpoints = h.Sequence.Setpoints.ToDictionary(s => s.Name, s => s.Celsius);
        var target = h.Sequence.Trim!.Dac!.Target;
        var squares = new List<double>();
        var units = 0;
        var checkedUnits = 0;
        for (var batch = 0; batch < 3; batch++)
        {
            var loaded = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);
            var outcome = await h.RunAsync(loaded);
            for (var i = 0; i < loaded.Count; i++)
            {
                h.Rig.Unload(i + 1);
                var run = outcome.Runs.Single(r => r.Serial == loaded[i].Serial);
                units++;
                checkedUnits += run.Readings.Any(r => r.Name == "trim.check.residual" && r.Note is null) ? 1 : 0;
                var trim = run.Trim!;
                Assert.Equal(trim.Values["gainCode"], run.Readings.Single(r => r.Name == "trim.gainCode").Value);
                Assert.Equal(trim.Values["offsetCode"], run.Readings.Single(r => r.Name == "trim.offsetCode").Value);
                var gain = (long)trim.Values["gainCode"];
                var offset = (long)trim.Values["offsetCode"];
                var shift = trim.Inputs.TryGetValue("check.residualVolts", out var r) ? r : 0.0;
                var spec = h.Sequence.Trim.Dac;
                var ratio = DacTrim.GainFactor(spec.Gain, gain) / DacTrim.GainFactor(spec.Gain, spec.Gain.Nominal);
                double Intended(double celsius) =>
                    target.IndicatedC((ratio * loaded[i].CalibrationOutputVolts(celsius)) + DacTrim.OffsetVolts(spec.Offset, offset) + shift) - celsius;
                squares.AddRange(setpoints.Values.Select(c => Math.Pow(loaded[i].TrueErrorC(target, c) - Intended(c), 2)));
            }
        }

        return (units, checkedUnits, Math.Sqrt(squares.Average()));
    }

    private static async Task<Dictionary<int, double>> TrueErrorsAtVerifyAsync(Func<FixtureDefinition, FixtureDefinition> edit)
    {
        var h = new CoordinatorHarness(seed: 31, editFixture: edit);
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);
        await h.RunAsync(units);
        var target = h.Sequence.Trim!.Dac!.Target;
        return Enumerable.Range(1, 4).ToDictionary(slot => slot, slot => units[slot - 1].TrueErrorC(target, 5.0));
    }
}
