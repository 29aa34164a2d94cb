using System.Diagnostics;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Throughput;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Demo;

/// <summary>
/// Measures, on the simulator in virtual time, how many units per hour a sequence gets with the baseline schedule,
/// with LineTest's fast schedule and at the thermal bound; and what a simulated shift costs in wall time and memory.
/// </summary>
public static class ThroughputBench
{
    /// <summary>
    /// Runs <paramref name="batches"/> full batches on the fast schedule and the same number of units one at a time
    /// on the baseline, all defect-free, each schedule on its own rig from the standby temperature.
    /// </summary>
    public static async Task<ThroughputFigures> MeasureAsync(
        FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int batches, int seed, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(batches);
        var timing = new InstrumentTiming();
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();
        var units = batches * slots.Count;

        var fast = new BenchRig(fixture, sequence, sha256, seed, timing);
        var fastSeconds = 0.0;
        var boundSeconds = 0.0;
        var windowBoundSeconds = 0.0;
        string? aborted = null;
        var blockC = fixture.Source.StandbyC;
        for (var b = 0; b < batches && aborted is null; b++)
        {
            var outcome = await fast.RunAsync(slots, BatchSchedule.Fast, ct).ConfigureAwait(false);
            fastSeconds += (outcome.Ended - outcome.Started).TotalSeconds;
            var planned = SetpointPlan.Apply(sequence, fixture.Source, blockC);
            boundSeconds += ThermalBound.Compute(planned, fixture.Source, blockC, slots.Count, timing.ReferenceReadSeconds, timing.MeterReadSeconds).BatchSeconds;
            windowBoundSeconds += ThermalBound.Compute(SettleSettings.ForAll(planned, null), fixture.Source, blockC, slots.Count, timing.ReferenceReadSeconds,
                timing.MeterReadSeconds).BatchSeconds;
            blockC = outcome.Setpoints.Count > 0 ? outcome.Setpoints[^1].TargetC : blockC;
            aborted = outcome.Aborted;
        }

        var slow = new BenchRig(fixture, sequence, sha256, seed, timing);
        var baseline = BatchSchedule.Baseline(sequence, fixture.Source);
        var baselineSeconds = 0.0;
        for (var u = 0; u < units && aborted is null; u++)
        {
            var outcome = await slow.RunAsync([slots[u % slots.Count]], baseline, ct).ConfigureAwait(false);
            baselineSeconds += (outcome.Ended - outcome.Started).TotalSeconds;
            aborted = outcome.Aborted;
        }

        return new ThroughputFigures(sequence.Id, units, batches, baselineSeconds, fastSeconds, boundSeconds, aborted, windowBoundSeconds,
            Cli.DryRunCommand.SequenceMode(sequence));
    }

    /// <summary>
    /// Runs a simulated shift of <paramref name="units"/> units (the demo's shift: defects included, every run stored in
    /// a results database under <paramref name="resultsDirectory"/>) and measures its wall time, the process's peak
    /// working set and the managed allocations.
    /// </summary>
    public static async Task<EngineFigures> ShiftAsync(
        FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int seed, string resultsDirectory, ILoggerFactory loggers,
        CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        var shift = new SimulatedShift(
            new ShiftOptions
            {
                Fixture = fixture,
                Sequence = sequence,
                SequenceSha256 = sha256,
                Units = units,
                Slots = fixture.Slots.Count,
                Seed = seed,
                ResultsDirectory = resultsDirectory,
                Station = "bench",
            },
            loggers);
        using var process = Process.GetCurrentProcess();
        var cpuBefore = process.TotalProcessorTime;
        var allocatedBefore = GC.GetTotalAllocatedBytes(precise: false);
        var gen2Before = GC.CollectionCount(2);
        var summary = await shift.RunAsync(_ => { }, ct).ConfigureAwait(false);
        var allocated = GC.GetTotalAllocatedBytes(precise: false) - allocatedBefore;
        process.Refresh();
        return new EngineFigures(summary.Units, summary.SimulatedSeconds, summary.WallSeconds, (process.TotalProcessorTime - cpuBefore).TotalSeconds,
            process.PeakWorkingSet64, allocated, GC.CollectionCount(2) - gen2Before, StoredRuns: true);
    }

    /// <summary>
    /// The engine alone: <paramref name="units"/> units (with the fixture's defect rate) through the coordinator, full
    /// batches back to back, runs discarded and nothing logged, so the figure is the coordinator and simulator only.
    /// </summary>
    public static async Task<EngineFigures> EngineOnlyAsync(FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int units, int seed, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        using var process = Process.GetCurrentProcess();
        var wallStart = TimeProvider.System.GetTimestamp();
        var cpuBefore = process.TotalProcessorTime;
        var allocatedBefore = GC.GetTotalAllocatedBytes(precise: false);
        var gen2Before = GC.CollectionCount(2);
        var rig = new BenchRig(fixture, sequence, sha256, seed, new InstrumentTiming(), withDefects: true);
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();
        var simulated = 0.0;
        var done = 0;
        while (done < units)
        {
            var batch = slots.Take(Math.Min(slots.Count, units - done)).ToList();
            var outcome = await rig.RunAsync(batch, BatchSchedule.Fast, ct).ConfigureAwait(false);
            simulated += (outcome.Ended - outcome.Started).TotalSeconds;
            done += batch.Count;
        }

        var wall = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds;
        var allocated = GC.GetTotalAllocatedBytes(precise: false) - allocatedBefore;
        process.Refresh();
        return new EngineFigures(done, simulated, wall, (process.TotalProcessorTime - cpuBefore).TotalSeconds, process.PeakWorkingSet64, allocated,
            GC.CollectionCount(2) - gen2Before, StoredRuns: false);
    }

    /// <summary>One simulated rig and coordinator with defect-free units, batches run back to back (no standby between).</summary>
    private sealed class BenchRig
    {
        private readonly SimulatedStation _station;
        private readonly BatchCoordinator _coordinator;
        private readonly SequenceDefinition _sequence;
        private readonly string _sha256;

        public BenchRig(FixtureDefinition fixture, SequenceDefinition sequence, string sha256, int seed, InstrumentTiming timing, bool withDefects = false)
        {
            var simulation = fixture.Simulation ?? new SimulationDefinition();
            simulation = withDefects ? simulation : simulation with { DefectRate = 0 };
            var perfect = fixture with { Simulation = simulation };
            var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 1, 1, 6, 0, 0, TimeSpan.Zero));
            _station = SimulatedStation.Create(perfect, sequence.Product, seed, clock);
            _coordinator = _station.Coordinator(new DiscardSink(), new CoordinatorParts { Timing = timing });
            _sequence = sequence;
            _sha256 = sha256;
        }

        public async Task<BatchOutcome> RunAsync(IReadOnlyList<int> slots, BatchSchedule schedule, CancellationToken ct)
        {
            var loads = _station.LoadUnits(slots).Select(l => l.Load).ToList();
            var outcome = await _coordinator.RunAsync(
                new BatchRequest { Sequence = _sequence, SequenceSha256 = _sha256, Station = "bench", Loads = loads, Schedule = schedule }, ct)
                .ConfigureAwait(false);
            foreach (var slot in slots)
            {
                _station.Rig.Unload(slot);
            }

            return outcome;
        }
    }

    private sealed class DiscardSink : IRunSink
    {
        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken) => Task.CompletedTask;
    }
}
