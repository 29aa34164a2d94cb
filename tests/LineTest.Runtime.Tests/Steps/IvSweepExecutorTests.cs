using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

public sealed class IvSweepExecutorTests
{
    [Fact]
    public async Task RunAsync_GoodUnits_RecordFittedJunctionCloseToTheTruth()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Pass, r.Verdict));
        foreach (var unit in units)
        {
            var run = outcome.Runs.Single(r => r.Serial == unit.Serial);
            double Value(string name) => run.Readings.Single(r => r.Name == name).Value!.Value;
            var diode = unit.Parameters.Diode;
            var kelvinLow = Value("iv-low.reference") + 273.15;

            // The simulated SMU reads the part's own diode (20 µV noise): the fit must find its n, R_s and I_s.
            Assert.Equal(diode.Ideality, Value("iv-low.n"), 0.01);
            Assert.Equal(diode.SeriesResistanceOhms, Value("iv-low.rs"), 3.0);
            Assert.Equal(Math.Log10(diode.SaturationCurrentAmps(kelvinLow)), Value("iv-low.log10Is"), 0.1);
            Assert.Equal(diode.Ideality, Value("iv-high.n"), 0.01);
            Assert.InRange(Value("iv-low.maxResidual"), 0, 0.2);

            // dV_f/dT at the 10 µA bias, against the same diode's chord between the two sweep temperatures; a silicon
            // diode's forward voltage falls by about 2 mV/°C [common practice].
            var t1 = Value("iv-low.reference");
            var t2 = Value("iv-high.reference");
            var expectedSlope = (diode.ForwardVolts(t2, 10e-6) - diode.ForwardVolts(t1, 10e-6)) / (t2 - t1) * 1000;
            Assert.Equal(expectedSlope, Value("iv-high.tempco"), 0.01);
            Assert.InRange(Value("iv-high.tempco"), -2.4, -1.6);
            Assert.InRange(Value("iv-high.vf0K"), 1.15, 1.25);
            Assert.Equal("mV/degC", run.Readings.Single(r => r.Name == "iv-high.tempco").Unit);
        }
    }

    [Fact]
    public async Task RunAsync_SensorDefects_FailWithAReasonNamingTheDefect()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.HighSeriesResistance, UnitDefect.LeakyJunction, UnitDefect.WrongPart, UnitDefect.None);

        var outcome = await h.RunAsync(units);

        var highRs = outcome.Runs.Single(r => r.Slot == 1);
        var leaky = outcome.Runs.Single(r => r.Slot == 2);
        var wrong = outcome.Runs.Single(r => r.Slot == 3);
        Assert.All([highRs, leaky, wrong], r => Assert.Equal(Verdict.Fail, r.Verdict));
        Assert.Equal("iv-low.rs", highRs.FirstFailingReading);
        Assert.Contains("bad bond", highRs.Reason, StringComparison.Ordinal);
        Assert.StartsWith("iv-low.", leaky.FirstFailingReading, StringComparison.Ordinal);
        Assert.Contains("leaky junction", leaky.Reason, StringComparison.Ordinal);
        Assert.StartsWith("iv-low.", wrong.FirstFailingReading, StringComparison.Ordinal);
        Assert.Contains("wrong part", wrong.Reason, StringComparison.Ordinal);
        Assert.Equal(Verdict.Pass, outcome.Runs.Single(r => r.Slot == 4).Verdict);
    }

    [Fact]
    public async Task RunAsync_SourceMeterSilent_ErrorsTheBatchNamingTheInstrument()
    {
        var h = new CoordinatorHarness();
        var units = h.Load(UnitDefect.None, UnitDefect.None);
        h.Rig.InjectFault(RigFault.SourceMeterSilent());

        var outcome = await h.RunAsync(units);

        Assert.All(outcome.Runs, r => Assert.Equal(Verdict.Error, r.Verdict));
        Assert.Contains("source-measure unit lost", outcome.Aborted, StringComparison.Ordinal);
    }

    [Fact]
    public async Task RunAsync_SimulatedShiftWithSensorDefects_RejectsEveryDefectAndNoGoodUnit()
    {
        // 120 units with sensor defects 15 times more common than in the demo, through the two sweeps only (the rest
        // of the sequence judges other things). The same run at 1,000 units is quoted in the docs.
        const int count = 120;
        var h = new CoordinatorHarness(seed: 29, editSequence: SweepsOnly);
        var factory = new SimulatedUnitFactory(29, h.Rig.Simulation with { DefectRate = 0.02, SensorDefectRate = 0.09 }, h.Design);
        var truth = new Dictionary<string, UnitDefect>();
        var runs = new List<RunRecord>();
        for (var done = 0; done < count; done += 4)
        {
            var batch = Enumerable.Range(0, 4).Select(_ => factory.NextUnit()).ToList();
            for (var s = 0; s < batch.Count; s++)
            {
                h.Rig.Load(s + 1, batch[s]);
                truth[batch[s].Serial] = batch[s].Defect;
            }

            runs.AddRange((await h.RunAsync(batch)).Runs);
            for (var s = 0; s < batch.Count; s++)
            {
                h.Rig.Unload(s + 1);
            }
        }

        var sensorDefects = new[] { UnitDefect.HighSeriesResistance, UnitDefect.LeakyJunction, UnitDefect.WrongPart, UnitDefect.OpenSensor };
        Assert.All(runs.Where(r => truth[r.Serial] is UnitDefect.None or UnitDefect.StuckDac), r => Assert.Equal(Verdict.Pass, r.Verdict));
        Assert.All(runs.Where(r => sensorDefects.Contains(truth[r.Serial])), r => Assert.Equal(Verdict.Fail, r.Verdict));
        Assert.True(runs.Count(r => truth[r.Serial] is UnitDefect.HighSeriesResistance or UnitDefect.LeakyJunction or UnitDefect.WrongPart) >= 5,
            "the shift should hold several sensor defects");
    }

    private static SequenceDefinition SweepsOnly(SequenceDefinition sequence) => sequence with
    {
        Steps = sequence.Steps.Where(s => s is IdentifyStep or SettleStep { Setpoint: "cal-low" or "cal-high" } or IvSweepStep).ToList(),
    };
}
