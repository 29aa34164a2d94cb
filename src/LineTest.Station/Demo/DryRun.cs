using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Core.Throughput;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;

namespace LineTest.Station.Demo;

/// <summary>
/// Runs one batch of defect-free simulated units through a sequence in virtual time and reports the timeline per
/// setpoint, the batch time and units per hour, beside the thermal lower bound. Nothing is stored.
/// </summary>
public static class DryRun
{
    /// <summary>Runs the dry run.</summary>
    public static async Task<DryRunReport> RunAsync(FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int seed, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        var simulation = (fixture.Simulation ?? new SimulationDefinition()) with { DefectRate = 0, SensorDefectRate = 0 };
        var perfect = fixture with { Simulation = simulation };
        var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 1, 1, 6, 0, 0, TimeSpan.Zero));
        var station = SimulatedStation.Create(perfect, sequence.Product, seed, clock);
        var timing = new InstrumentTiming();
        var coordinator = station.Coordinator(new MemorySink(), new CoordinatorParts { Timing = timing });
        var loads = station.LoadUnits(perfect.Slots.Select(s => s.Slot).Order().Take(units)).Select(l => l.Load).ToList();

        var outcome = await coordinator.RunAsync(
            new BatchRequest { Sequence = sequence, SequenceSha256 = sha256, Station = "dry-run", Loads = loads, Mode = "engineering" },
            ct).ConfigureAwait(false);
        // Over the setpoint order the coordinator itself plans (file order unless the sequence marks it free): the
        // shortest-travel order also gives the lowest bound, so the bound stays a bound.
        var planned = SetpointPlan.Apply(sequence, perfect.Source, perfect.Source.StandbyC);
        var bound = ThermalBound.Compute(planned, perfect.Source, perfect.Source.StandbyC, loads.Count, timing.ReferenceReadSeconds, timing.MeterReadSeconds);
        var windowBound = ThermalBound.Compute(SettleSettings.ForAll(planned, null), perfect.Source, perfect.Source.StandbyC, loads.Count,
            timing.ReferenceReadSeconds, timing.MeterReadSeconds);
        return new DryRunReport(Timeline(outcome), (outcome.Ended - outcome.Started).TotalSeconds, loads.Count, bound, windowBound, outcome.Runs, outcome.Aborted);
    }

    private static List<DryRunPhase> Timeline(BatchOutcome outcome)
    {
        var phases = new List<DryRunPhase>();
        var records = outcome.Setpoints;
        for (var i = 0; i < records.Count; i++)
        {
            var r = records[i];
            var commanded = r.StableAt!.Value - TimeSpan.FromSeconds(r.SecondsToStable);
            var soakEnd = r.StableAt.Value + TimeSpan.FromSeconds(r.SoakSeconds);
            var next = i + 1 < records.Count
                ? records[i + 1].StableAt!.Value - TimeSpan.FromSeconds(records[i + 1].SecondsToStable)
                : outcome.Ended;
            var (mode, why) = SettledBy(outcome, r.Name);
            phases.Add(new DryRunPhase(r.Name, r.TargetC, (commanded - outcome.Started).TotalSeconds, r.SecondsToStable, r.SoakSeconds, (next - soakEnd).TotalSeconds,
                mode, why));
        }

        return phases;
    }

    /// <summary>
    /// How <paramref name="setpoint"/> settled, from the first run's <c>settle.&lt;setpoint&gt;.mode</c> reading: its note's
    /// word and reason; <c>window</c> when the setpoint recorded none (window mode).
    /// </summary>
    private static (string Mode, string? Why) SettledBy(BatchOutcome outcome, string setpoint)
    {
        var name = SettleModeCodes.ModeReading(setpoint);
        var note = outcome.Runs.SelectMany(r => r.Readings).FirstOrDefault(r => r.Name == name)?.Note;
        if (note is null)
        {
            return (SettleModes.Window, null);
        }

        var colon = note.IndexOf(": ", StringComparison.Ordinal);
        return colon < 0 ? (note, null) : (note[..colon], note[(colon + 2)..]);
    }

    private sealed class MemorySink : IRunSink
    {
        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken) => Task.CompletedTask;
    }
}
