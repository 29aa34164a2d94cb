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

    /// <summary>Runs the shift; <paramref name="runEnded"/> sees each run once it is stored.</summary>
    public async Task<ShiftSummary> RunAsync(Action<RunRecord> runEnded, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(runEnded);
        var wallStart = TimeProvider.System.GetTimestamp();
        var fixture = _options.Fixture;
        var sensor = ReferenceConversion.SensorOf(fixture);
        var clock = new VirtualTimeProvider(TimeProvider.System.GetUtcNow());
        var start = clock.GetUtcNow();
        var rig = new SimulatedRig(fixture, _options.Seed, clock, ReferenceConversion.FromCelsius(sensor));
        var design = SimulatedUnitDesign.ForProduct(_options.Sequence.Product)
            ?? throw new InvalidOperationException(
                $"The simulator builds {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}, not '{_options.Sequence.Product}'.");
        using var serialRig = _options.Serial ? new SimulatedSerialRig(rig, _loggers) : null;
        var factory = new SimulatedUnitFactory(_options.Seed, rig.Simulation, design);
        var slots = fixture.Slots.Select(s => s.Slot).Order().Take(_options.Slots).ToList();
        var runs = new List<RunRecord>();
        await using var store = SqliteResultStore.Open(_options.ResultsDirectory);
        var sink = new StoreSink(store, run =>
        {
            runs.Add(run);
            runEnded(run);
        });
        var coordinator = new BatchCoordinator(
            serialRig?.Instruments ?? rig.Instruments,
            fixture,
            ReferenceConversion.ToCelsius(sensor),
            clock,
            sink,
            new AutoConfirmOperator(),
            observer: null,
            _loggers.CreateLogger<BatchCoordinator>(),
            partFitting: new SimulatedPartFitting(rig));

        var remaining = _options.Units;
        try
        {
            while (remaining > 0)
            {
                cancellationToken.ThrowIfCancellationRequested();
                var loads = new List<SlotLoad>();
                foreach (var slot in slots.Take(Math.Min(remaining, slots.Count)))
                {
                    var unit = factory.NextUnit();
                    rig.Load(slot, unit);
                    loads.Add(new SlotLoad(slot, unit.Serial));
                }

                remaining -= loads.Count;
                var request = new BatchRequest
                {
                    Sequence = _options.Sequence,
                    SequenceSha256 = _options.SequenceSha256,
                    Station = _options.Station,
                    Loads = loads,
                    Operator = _options.Operator,
                    Lot = _options.Lot,
                };
                await coordinator.RunAsync(request, cancellationToken).ConfigureAwait(false);
                foreach (var load in loads)
                {
                    rig.Unload(load.Slot);
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
