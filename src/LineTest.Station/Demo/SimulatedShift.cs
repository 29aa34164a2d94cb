using LineTest.Core.Results;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Demo;

/// <summary>
/// Runs a production shift on the built-in simulator in accelerated virtual time: units come off a seeded
/// production line (the design of the sequence's product, <see cref="SimulatedUnitDesign.ForProduct"/>), are loaded
/// batch by batch, tested by the real coordinator and stored in the real database.
/// </summary>
public sealed class SimulatedShift
{
    private readonly ShiftOptions _options;
    private readonly ILoggerFactory _loggers;

    /// <summary>Creates a shift.</summary>
    public SimulatedShift(ShiftOptions options, ILoggerFactory loggers)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(loggers);
        _options = options;
        _loggers = loggers;
    }

    /// <summary>Runs interrupted by the last stop and stored as such at the start of this shift.</summary>
    public IReadOnlyList<RunRecord> Recovered { get; private set; } = [];

    /// <summary>Why production mode refused the sequence (no unit was tested), or null.</summary>
    public string? Refusal { get; private set; }

    /// <summary>
    /// Runs the shift; <paramref name="runEnded"/> sees each run once it is stored. First the source goes to standby
    /// and runs left in progress by the last stop are stored as interrupted; in production mode a sequence that is
    /// not released is then refused (see <see cref="Refusal"/>) before any unit is loaded.
    /// </summary>
    public async Task<ShiftSummary> RunAsync(Action<RunRecord> runEnded, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(runEnded);
        var wallStart = TimeProvider.System.GetTimestamp();
        var fixture = _options.Fixture;
        var clock = _options.Clock ?? new VirtualTimeProvider(TimeProvider.System.GetUtcNow());
        var start = clock.GetUtcNow();
        var station = SimulatedStation.Create(fixture, _options.Sequence.Product, _options.Seed, clock, _options.FirstSerialCounter);
        using var serialRig = _options.Serial ? new SimulatedSerialRig(station.Rig, _loggers) : null;
        var slots = fixture.Slots.Select(s => s.Slot).Order().Take(_options.Slots).ToList();
        var runs = new List<RunRecord>();
        await using var store = SqliteResultStore.Open(_options.ResultsDirectory);
        var sink = new StoreSink(store, run =>
        {
            runs.Add(run);
            runEnded(run);
        });
        var coordinator = station.Coordinator(
            sink, new CoordinatorParts { Logger = _loggers.CreateLogger<BatchCoordinator>() }, serialRig?.Instruments);

        Recovered = await StartupRecovery.RunAsync(coordinator, store, _loggers.CreateLogger<SimulatedShift>(), cancellationToken).ConfigureAwait(false);
        if (Recovered.Count > 0 && _options.Notice is { } notice)
        {
            notice(StartupRecovery.Message(Recovered.Count));
            foreach (var run in Recovered)
            {
                notice($"  interrupted: {run.Serial} slot {run.Slot}, batch {run.BatchId}, {run.Readings.Count} readings kept");
            }
        }

        Refusal = await ProductionGate.RefusalAsync(
            _options.Mode, store, _options.Sequence.Id, _options.Sequence.Revision, _options.SequenceSha256, _options.SequenceFile, cancellationToken).ConfigureAwait(false);
        if (Refusal is not null)
        {
            return new ShiftSummary
            {
                Units = 0,
                Pass = 0,
                Fail = 0,
                Error = 0,
                FirstPassYield = 0,
                SimulatedSeconds = 0,
                WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
                ResultsPath = store.DatabasePath,
            };
        }

        var remaining = _options.Units;
        try
        {
            while (remaining > 0)
            {
                cancellationToken.ThrowIfCancellationRequested();
                var loads = station.LoadUnits(slots.Take(Math.Min(remaining, slots.Count))).Select(l => l.Load).ToList();
                remaining -= loads.Count;
                var request = new BatchRequest
                {
                    Sequence = _options.Sequence,
                    SequenceSha256 = _options.SequenceSha256,
                    Station = _options.Station,
                    Loads = loads,
                    Operator = _options.Operator,
                    Lot = _options.Lot,
                    Mode = _options.Mode,
                };
                await coordinator.RunAsync(request, cancellationToken).ConfigureAwait(false);
                foreach (var load in loads)
                {
                    station.Rig.Unload(load.Slot);
                }

                if (remaining > 0)
                {
                    await Task.Delay(TimeSpan.FromSeconds(_options.ReloadSeconds), clock, cancellationToken).ConfigureAwait(false);
                }
            }
        }
        finally
        {
            await coordinator.StandbyAsync("end of shift").ConfigureAwait(false);
        }

        var pass = runs.Count(r => r.Verdict == Verdict.Pass);
        return new ShiftSummary
        {
            Units = runs.Count,
            Pass = pass,
            Fail = runs.Count(r => r.Verdict == Verdict.Fail),
            Error = runs.Count(r => r.Verdict == Verdict.Error),
            FirstPassYield = runs.Count == 0 ? 0 : (double)pass / runs.Count,
            SimulatedSeconds = (clock.GetUtcNow() - start).TotalSeconds,
            WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
            ResultsPath = store.DatabasePath,
        };
    }
}
