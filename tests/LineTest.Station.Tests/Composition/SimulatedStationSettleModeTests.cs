using LineTest.Core.Calibration;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Composition;

/// <summary>
/// The same simulated units judged by a station that waits for stability and by one that settles predictively: the
/// verdicts must be the same, and the verify errors must agree within the uncertainties the two stations claim.
/// </summary>
public sealed class SimulatedStationSettleModeTests
{
    public static TheoryData<string> DemoSequences => new() { "sequences/ctp40a-dac.json", "sequences/ctp40d-firmware.json" };

    [Theory]
    [MemberData(nameof(DemoSequences))]
    public async Task Coordinator_SameUnitsWindowAndPredictive_SameVerdictsAndAgreeingVerifyErrors(string file)
    {
        // JCGM 100:2008 §6: two results of one measurand agree when their difference is within the combined expanded
        // uncertainty (the window mode's including its soak residual); the two runs may land one trim code apart (noise near a rounding boundary), so the difference
        // their trims predict is taken out first. Sixteen units of a fixed seed, the fixture's own defect rate, four
        // batches of four, each station on its own rig.
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/sim-dryblock-4.json")).Value!;
        var sequence = DefinitionFile.Sequence(RepoFiles.Path(file), fixture).Value!;
        var predictive = SettleSettings.ForAll(sequence, new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 });

        var window = await RunAsync(fixture, sequence);
        var predicted = await RunAsync(fixture, predictive);

        Assert.Equal(16, window.Count);
        Assert.Equal(window.Select(r => r.Serial).Order(), predicted.Select(r => r.Serial).Order());
        Assert.Contains(predicted, r => r.Readings.Any(x => x.Name.EndsWith(".mode", StringComparison.Ordinal) && x.Value == SettleModeCodes.Predictive));
        Assert.DoesNotContain(window, r => r.Readings.Any(x => x.Name.StartsWith("settle.", StringComparison.Ordinal)));
        foreach (var w in window)
        {
            var p = predicted.Single(r => r.Serial == w.Serial);
            Assert.Equal(w.Verdict, p.Verdict);
            if (w.Verdict != Verdict.Pass)
            {
                continue;
            }

            var ew = w.Readings.Single(r => r.Name == "verify.error");
            var ep = p.Readings.Single(r => r.Name == "verify.error");
            var unexplained = (ep.Value!.Value - ew.Value!.Value) - (p.Trim!.PredictedErrorC["verify"] - w.Trim!.PredictedErrorC["verify"]);
            // The window mode's reading also carries its soak residual (a unit that drifts at the soak limit r is still
            // r·τ from its well), which its verify budget leaves to the rated-range budget: rectangular ±r·τ
            // (TrimAccuracy.SoakResidualHalfWidthC, JCGM 100:2008 §4.3.7), expanded with k = 2 beside the two U.
            var soak = 2 * TrimAccuracy.SoakResidualHalfWidthC(sequence) / Math.Sqrt(3);
            Assert.InRange(Math.Abs(unexplained), 0, Math.Sqrt((ew.ExpandedUncertainty!.Value * ew.ExpandedUncertainty.Value)
                + (ep.ExpandedUncertainty!.Value * ep.ExpandedUncertainty.Value) + (soak * soak)));
        }
    }

    private static async Task<List<RunRecord>> RunAsync(FixtureDefinition fixture, SequenceDefinition sequence)
    {
        var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 12, 1, 6, 0, 0, TimeSpan.Zero));
        var station = SimulatedStation.Create(fixture, sequence.Product, 4711, clock);
        var sink = new ListSink();
        var coordinator = station.Coordinator(sink);
        for (var b = 0; b < 4; b++)
        {
            var loads = station.LoadUnits([1, 2, 3, 4]).Select(l => l.Load).ToList();
            await coordinator.RunAsync(new BatchRequest { Sequence = sequence, SequenceSha256 = "test", Station = "ST-T", Loads = loads }, CancellationToken.None);
            foreach (var slot in new[] { 1, 2, 3, 4 })
            {
                station.Rig.Unload(slot);
            }
        }

        return sink.Runs;
    }

    private sealed class ListSink : IRunSink
    {
        public List<RunRecord> Runs { get; } = [];

        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
        {
            Runs.Add(run);
            return Task.CompletedTask;
        }
    }
}
