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
    /// Why the shift was not run because it does not fit between the last stored run and now, or null.
    /// </summary>
    public string? Unplaced { get; private set; }

    /// <summary>
    /// Why the shift stopped before all its units were tested, or null: a batch could have ended after now because the
    /// shift ran slower than its plan. The runs stored before the stop are kept.
    /// </summary>
    public string? Stopped { get; private set; }

    /// <summary>The shift's plan (its estimated length), once <see cref="RunAsync"/> has made it.</summary>
    public ShiftPlan? Plan { get; private set; }

    /// <summary>Batches run on the simulator for this shift: the one that plans it, then the shift's own.</summary>
    public int BatchesSimulated { get; private set; }

    /// <summary>When the shift's virtual clock started (UTC).</summary>
    public DateTimeOffset StartedUtc { get; private set; }

    /// <summary>
    /// Runs the shift; <paramref name="runEnded"/> sees each run once it is stored. The shift continues the folder:
    /// serials after the highest stored one of the product, a virtual clock that starts one reload gap after the last
    /// stored run (at 06:00 UTC a week ago in an empty folder, further back for a long shift), and it must end no later
    /// than now: its length is planned from one defect-free batch (<see cref="ShiftPlan"/>), a shift planned to end in
    /// the future is not run (see <see cref="Unplaced"/>), and a shift slower than its plan stops before a batch that
    /// could end in the future (see <see cref="Stopped"/>). Then the source
    /// goes to standby and runs left in progress by the last stop are stored as interrupted; in production mode a
    /// sequence that is not released is refused (see <see cref="Refusal"/>) before any unit is loaded.
    /// </summary>
    public async Task<ShiftSummary> RunAsync(Action<RunRecord> runEnded, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(runEnded);
        var wallStart = TimeProvider.System.GetTimestamp();
        var design = SimulatedUnitDesign.ForProduct(_options.Sequence.Product)
            ?? throw new InvalidOperationException(
                $"The simulator builds {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}, not '{_options.Sequence.Product}'.");
        var now = _options.Clock.GetUtcNow();
        DateTimeOffset? lastEnded;
        string? highest;
        await using (var opened = SqliteResultStore.Open(_options.ResultsDirectory))
        {
            var reader = new SqliteResultReader(opened.DatabasePath);
            lastEnded = await reader.ReadLastEndedAsync(cancellationToken).ConfigureAwait(false);
            highest = await reader.ReadHighestSerialAsync($"{design.SerialPrefix}-{YearWeek:D4}-", cancellationToken).ConfigureAwait(false);
        }

        var firstCounter = _options.FirstSerial ?? (highest is { Length: >= 6 } && int.TryParse(highest.AsSpan(highest.Length - 6), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var counter) ? counter + 1 : _options.FirstSerialCounter);

        // The planned length of the shift, from one defect-free batch on the simulator (nothing stored) rather than a
        // dry pass of the whole shift, so that each unit is simulated once (see ShiftPlan).
        var slots = _options.Fixture.Slots.Select(s => s.Slot).Order().Take(_options.Slots).Count();
        var plan = await ShiftPlan.EstimateAsync(
            _options.Fixture, _options.Sequence, _options.SequenceSha256, _options.Units, slots, _options.Seed, _options.ReloadSeconds, cancellationToken).ConfigureAwait(false);
        BatchesSimulated = 1;
        Plan = plan;

        // An empty folder's first shift starts at 06:00 UTC a week back (further back for a long shift, room for three of
        // its size), as if the station had been in production since; later shifts start one reload gap after the last
        // stored run. Either way the shift must be planned to end by now.
        var start = plan.Start(lastEnded, now);
        if (!plan.Fits(start, now))
        {
            var fit = plan.UnitsThatFit(start, now, slots);
            var advice = fit > 0 ? FormattableString.Invariant($"test at most {fit} units, or use another results folder") : "use another results folder, or run it later";
            var after = lastEnded is { } end ? FormattableString.Invariant($"the runs in {_options.ResultsDirectory} end at {end.UtcDateTime:yyyy-MM-dd HH:mm} UTC and ") : string.Empty;
            Unplaced = FormattableString.Invariant(
                $"{after}a shift of {_options.Units} units is planned at {plan.Length.TotalHours:F1} h (and {plan.WorstOverrunSeconds / 3600:F1} h for a batch that runs to its timeouts), so starting {start.UtcDateTime:yyyy-MM-dd HH:mm} UTC it could end in the future; {advice}");
            return Summary(0, [], TimeSpan.Zero, wallStart, ResultsDatabase.PathIn(_options.ResultsDirectory));
        }

        StartedUtc = start;
        var outcome = await SimulateAsync(start, firstCounter, plan, now, runEnded, cancellationToken).ConfigureAwait(false);
        return Summary(outcome.Units, outcome.Runs, outcome.LastEnded - start, wallStart, outcome.DatabasePath);
    }

    /// <summary>Year and week in the demo serials (YYWW).</summary>
    private const int YearWeek = 2612;

    private ShiftSummary Summary(int units, List<RunRecord> runs, TimeSpan simulated, long wallStart, string path)
    {
        var pass = runs.Count(r => r.Verdict == Verdict.Pass);
        return new ShiftSummary
        {
            Units = runs.Count,
            Pass = pass,
            Fail = runs.Count(r => r.Verdict == Verdict.Fail),
            Error = runs.Count(r => r.Verdict == Verdict.Error),
            FirstPassYield = runs.Count == 0 ? 0 : (double)pass / runs.Count,
            SimulatedSeconds = units == 0 ? 0 : simulated.TotalSeconds,
            WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
            ResultsPath = path,
        };
    }

    private async Task<(int Units, List<RunRecord> Runs, DateTimeOffset LastEnded, string DatabasePath)> SimulateAsync(
        DateTimeOffset startUtc, int firstCounter, ShiftPlan plan, DateTimeOffset now, Action<RunRecord> runEnded, CancellationToken cancellationToken)
    {
        var fixture = _options.Fixture;
        var loggers = _loggers;
        var clock = new VirtualTimeProvider(startUtc);
        _options.ClockStarted?.Invoke(clock);

        var station = SimulatedStation.Create(fixture, _options.Sequence.Product, _options.Seed, clock, firstCounter, YearWeek);
        using var serialRig = _options.Serial ? new SimulatedSerialRig(station.Rig, loggers) : null;
        var slots = fixture.Slots.Select(s => s.Slot).Order().Take(_options.Slots).ToList();
        var runs = new List<RunRecord>();
        await using var store = SqliteResultStore.Open(_options.ResultsDirectory);
        var sink = new StoreSink(store, run =>
        {
            runs.Add(run);
            runEnded(run);
        });
        var coordinator = station.Coordinator(
            sink, new CoordinatorParts { Logger = loggers.CreateLogger<BatchCoordinator>() }, serialRig?.Instruments);

        var recovered = await StartupRecovery.RunAsync(coordinator, store, loggers.CreateLogger<SimulatedShift>(), cancellationToken).ConfigureAwait(false);
        Recovered = recovered;
        if (recovered.Count > 0)
        {
            _options.Notice?.Invoke(StartupRecovery.Message(recovered.Count));
            foreach (var run in recovered)
            {
                _options.Notice?.Invoke($"  interrupted: {run.Serial} slot {run.Slot}, batch {run.BatchId}, {run.Readings.Count} readings kept");
            }
        }

        Refusal = await ProductionGate.RefusalAsync(
            _options.Mode, store, _options.Sequence.Id, _options.Sequence.Revision, _options.SequenceSha256, _options.SequenceFile, cancellationToken).ConfigureAwait(false);
        if (Refusal is not null)
        {
            return (0, runs, startUtc, store.DatabasePath);
        }

        var remaining = _options.Units;
        try
        {
            while (remaining > 0)
            {
                cancellationToken.ThrowIfCancellationRequested();
                if (!plan.MayStartBatch(clock.GetUtcNow(), now))
                {
                    Stopped = FormattableString.Invariant(
                        $"stopped after {runs.Count} of {_options.Units} units: the shift ran slower than planned, and a batch started at {clock.GetUtcNow().UtcDateTime:yyyy-MM-dd HH:mm} UTC could end after now");
                    break;
                }

                BatchesSimulated++;
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

        return (runs.Count, runs, runs.Count == 0 ? startUtc : runs.Max(r => r.EndedUtc), store.DatabasePath);
    }
}
