using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.Storage.Sqlite;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Campaign;

/// <summary>
/// A fault campaign: simulated batches, each with probability <see cref="CampaignOptions.FaultRate"/> given one fault
/// (<see cref="CampaignFault"/>) at a random moment, tested by the real coordinator into the real database. Afterwards
/// the database is audited against the simulator's ground truth: no unit known to be out of limits may be stored as
/// a pass, every loaded unit has exactly one run with a verdict, and every stopped batch left the source at standby.
/// </summary>
public sealed class FaultCampaign(CampaignOptions options)
{
    private readonly CampaignOptions _options = options ?? throw new ArgumentNullException(nameof(options));

    /// <summary>Runs the campaign and audits the results.</summary>
    public async Task<CampaignSummary> RunAsync(CancellationToken cancellationToken)
    {
        var wallStart = TimeProvider.System.GetTimestamp();
        var fixture = _options.Fixture;
        var sequence = _options.Sequence;
        var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 3, 16, 6, 0, 0, TimeSpan.Zero));
        var start = clock.GetUtcNow();
        var station = SimulatedStation.Create(fixture, sequence.Product, _options.Seed, clock);
        var rig = station.Rig;
        var faults = new Random(unchecked(_options.Seed * 7919 + 17));
        var watch = new SourceWatch(rig.Instruments.Source);
        var instruments = rig.Instruments with { Source = watch };
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();
        var settles = sequence.Steps.OfType<SettleStep>().Count();

        var units = new Dictionary<string, SimulatedUnit>(StringComparer.Ordinal);
        var loaded = new List<(string Batch, string Serial)>();
        var byKind = Enum.GetValues<CampaignFault>().ToDictionary(k => k.ToString(), _ => 0);
        int batches = 0, faulted = 0, aborted = 0, awayFromStandby = 0;

        await using (var store = SqliteResultStore.Open(_options.ResultsDirectory))
        {
            var coordinator = station.Coordinator(new StoreSink(store), instruments: instruments);
            var remaining = _options.Units;
            while (remaining > 0)
            {
                cancellationToken.ThrowIfCancellationRequested();
                batches++;
                var batchId = $"C{_options.Seed}-{batches:D5}";
                var loads = new List<SlotLoad>();
                foreach (var (load, unit) in station.LoadUnits(slots.Take(Math.Min(remaining, slots.Count))))
                {
                    units[unit.Serial] = unit;
                    loads.Add(load);
                    loaded.Add((batchId, unit.Serial));
                }

                remaining -= loads.Count;
                watch.NewBatch();
                CampaignFault? fault = faults.NextDouble() < _options.FaultRate ? (CampaignFault)faults.Next(6) : null;
                var sourceMayAnswer = true;
                if (fault is { } kind)
                {
                    faulted++;
                    byKind[kind.ToString()]++;
                    sourceMayAnswer = Inject(kind, rig, watch, faults, loads, settles);
                }

                var outcome = await coordinator.RunAsync(
                    new BatchRequest
                    {
                        Sequence = sequence,
                        SequenceSha256 = _options.SequenceSha256,
                        Station = _options.Station,
                        Loads = loads,
                        Operator = "campaign",
                        Lot = $"CAMPAIGN-{_options.Seed}",
                        BatchId = batchId,
                    },
                    cancellationToken).ConfigureAwait(false);
                if (outcome.Aborted is not null)
                {
                    aborted++;
                    var atStandby = !sourceMayAnswer || rig.Block.SetpointC == fixture.Source.StandbyC;
                    if (!watch.LastCommandWasStandby || !atStandby)
                    {
                        awayFromStandby++;
                    }
                }

                // The technician repairs what broke before the next load.
                rig.ClearFaults();
                foreach (var load in loads)
                {
                    rig.Unload(load.Slot);
                }

                await Task.Delay(TimeSpan.FromSeconds(30), clock, cancellationToken).ConfigureAwait(false);
            }

            await coordinator.StandbyAsync("end of campaign").ConfigureAwait(false);
        }

        var audit = Audit(ResultsDatabase.PathIn(_options.ResultsDirectory), loaded, units, sequence);
        return new CampaignSummary
        {
            Units = loaded.Count,
            Batches = batches,
            FaultedBatches = faulted,
            FaultsByKind = byKind,
            AbortedBatches = aborted,
            Pass = audit.Pass,
            Fail = audit.Fail,
            Error = audit.Error,
            WrongPasses = audit.WrongPasses,
            LostRuns = audit.Lost,
            DuplicateRuns = audit.Duplicates,
            RunsWithoutVerdict = audit.InProgress,
            SourceLeftAwayFromStandby = awayFromStandby,
            SimulatedSeconds = (clock.GetUtcNow() - start).TotalSeconds,
            WallSeconds = TimeProvider.System.GetElapsedTime(wallStart).TotalSeconds,
            ResultsPath = ResultsDatabase.PathIn(_options.ResultsDirectory),
        };
    }

    /// <summary>Arms one fault at a random moment of the batch. Returns false when the source itself cannot take commands afterwards.</summary>
    private static bool Inject(CampaignFault kind, SimulatedRig rig, SourceWatch watch, Random random, List<SlotLoad> loads, int settles)
    {
        // Command counts span a whole batch of the demo sequences (a few hundred meter reads, several hundred reference
        // reads, one setpoint per settle, a handful of link commands per unit), so some faults strike early, some late.
        var slot = loads[random.Next(loads.Count)].Slot;
        switch (kind)
        {
            case CampaignFault.SilentInstrument:
                switch (random.Next(3))
                {
                    case 0:
                        rig.InjectFault(RigFault.MeterSilent(random.Next(400)));
                        return true;
                    case 1:
                        rig.InjectFault(RigFault.ReferenceSilent(random.Next(800)));
                        return true;
                    default:
                        rig.InjectFault(RigFault.SourceSilent(random.Next(2 * settles)));
                        return false;
                }

            case CampaignFault.GarbageReplies:
                rig.InjectFault(random.Next(2) == 0 ? RigFault.MeterGarbage(random.Next(400)) : RigFault.UnitGarbage(slot, random.Next(12)));
                return true;
            case CampaignFault.LostPort:
                rig.InjectFault(RigFault.MeterPortLost(random.Next(400)));
                return true;
            case CampaignFault.UnitStopsAnswering:
                rig.InjectFault(RigFault.UnitSilent(slot, 1 + random.Next(12)));
                return true;
            case CampaignFault.SourceNeverSettles:
                watch.After(1 + random.Next(settles), () => rig.InjectFault(RigFault.SourceHeaterFault()));
                return false;
            case CampaignFault.ReferenceDrifts:
                // 0.5 … 30 °C per hour, either sign: from slow ageing to a broken sensor lead.
                var rate = (0.5 + (random.NextDouble() * 29.5)) * (random.Next(2) == 0 ? 1 : -1);
                watch.After(1 + random.Next(settles), () => rig.InjectFault(RigFault.ReferenceDrift(rate)));
                return true;
            default:
                throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown fault family.");
        }
    }

    private static (int Pass, int Fail, int Error, int WrongPasses, int Lost, int Duplicates, int InProgress) Audit(
        string databasePath, List<(string Batch, string Serial)> loaded, Dictionary<string, SimulatedUnit> units, SequenceDefinition sequence)
    {
        using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = databasePath, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString());
        connection.Open();
        var stored = new Dictionary<(string, string), List<string>>();
        using (var command = connection.CreateCommand())
        {
            command.CommandText = "SELECT batch_id, serial, verdict FROM runs;";
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                var key = (reader.IsDBNull(0) ? string.Empty : reader.GetString(0), reader.GetString(1));
                if (!stored.TryGetValue(key, out var verdicts))
                {
                    stored[key] = verdicts = [];
                }

                verdicts.Add(reader.GetString(2));
            }
        }

        using var journal = connection.CreateCommand();
        journal.CommandText = "SELECT count(*) FROM runs_in_progress;";
        var inProgress = Convert.ToInt32(journal.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);

        int pass = 0, fail = 0, error = 0, wrong = 0, lost = 0, duplicates = 0;
        foreach (var (batch, serial) in loaded)
        {
            if (!stored.TryGetValue((batch, serial), out var verdicts))
            {
                lost++;
                continue;
            }

            duplicates += verdicts.Count > 1 ? 1 : 0;
            foreach (var verdict in verdicts)
            {
                switch (verdict)
                {
                    case "pass":
                        pass++;
                        wrong += TrulyOutOfLimits(units[serial], sequence) ? 1 : 0;
                        break;
                    case "fail":
                        fail++;
                        break;
                    default:
                        error++;
                        break;
                }
            }
        }

        return (pass, fail, error, wrong, lost, duplicates, inProgress);
    }

    /// <summary>
    /// Whether the simulator's ground truth puts the shipped unit outside a verify step's limits at its setpoint, or (where the
    /// sequence judges it) its largest error over the rated range above the rated range's limit.
    /// </summary>
    internal static bool TrulyOutOfLimits(SimulatedUnit unit, SequenceDefinition sequence)
    {
        var target = sequence.Trim?.AnalogTarget;
        foreach (var verify in sequence.Steps.OfType<VerifyStep>())
        {
            var celsius = sequence.Setpoints.First(s => s.Name == verify.Setpoint).Celsius;
            var errorC = unit.Design.Kind == SimulatedUnitKind.FirmwareTrimmed || target is null
                ? unit.TrueReportedErrorC(celsius)
                : unit.TrueErrorC(target, celsius);
            if (!double.IsFinite(errorC) || errorC < (verify.Limits.Low ?? double.NegativeInfinity) || errorC > (verify.Limits.High ?? double.PositiveInfinity))
            {
                return true;
            }
        }

        // Where the sequence judges the predicted error over its rated range, the truth is judged over it too.
        if (sequence.RatedRange is { MaxAbsErrorLimits: { } rangeLimits } range)
        {
            var grid = Enumerable.Range(0, (int)Math.Floor(range.HighC - range.LowC) + 1).Select(i => range.LowC + i).ToArray();
            var worst = unit.Design.Kind == SimulatedUnitKind.FirmwareTrimmed || target is null
                ? grid.Max(c => Math.Abs(unit.TrueReportedErrorC(c)))
                : unit.TrueErrorsC(grid, target).Max(Math.Abs);
            if (!double.IsFinite(worst) || worst > (rangeLimits.High ?? double.PositiveInfinity))
            {
                return true;
            }
        }

        return false;
    }
}
