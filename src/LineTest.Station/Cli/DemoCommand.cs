using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary><c>linetest demo</c>: a simulated production shift in accelerated time.</summary>
public static class DemoCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var units = new Option<int>("--units") { Description = "Units to test", DefaultValueFactory = _ => 48 };
        var slots = new Option<int>("--slots") { Description = "Slots used per batch", DefaultValueFactory = _ => 4 };
        var seed = new Option<int>("--seed") { Description = "Simulator seed (same seed, same units and verdicts)", DefaultValueFactory = _ => 4040 };
        var results = new Option<string>("--results") { Description = "Results folder (results.db is appended to)", DefaultValueFactory = _ => "results" };
        var json = new Option<bool>("--json") { Description = "Print the summary as one JSON object" };
        var sequence = new Option<string?>("--sequence") { Description = "Sequence file (default: the station's)" };
        var fixture = new Option<string?>("--fixture") { Description = "Simulated fixture file (default: the station's)" };
        var lot = new Option<string?>("--lot") { Description = "Lot stored with every run" };
        var serial = new Option<bool>("--serial") { Description = "Reach the simulated instruments through the real serial drivers over pseudo-terminal ports (Linux)" };
        var production = new Option<bool>("--production") { Description = "Production mode: run only a released sequence file (see 'linetest release')" };
        var verbose = new Option<bool>("--verbose") { Description = "Also write log events to the console (standard error); they always go to the log file" };
        var stations = new Option<int>("--stations") { Description = "Simulated stations at once, each in its own folder under --results (--units each)", DefaultValueFactory = _ => 1 };
        var factory = new Option<string?>("--factory") { Description = "Forward every stored run to this factory database (Npgsql connection string)" };
        var station = new Option<string?>("--station") { Description = "Station id stored with every run (default: the station's)" };
        var firstSerial = new Option<int?>("--first-serial") { Description = "Counter of the first serial (default: after the highest stored one)" };
        var command = new Command("demo", "Run a simulated production shift on the built-in simulator")
        {
            units, slots, seed, results, json, sequence, fixture, lot, serial, production, verbose, stations, factory, station, firstSerial,
        };
        command.SetAction(async (parse, ct) =>
        {
            var options = context.Options;
            var fixturePath = parse.GetValue(fixture) is { } f ? Path.GetFullPath(f) : ContentRoot.Resolve(context.Root, options.Fixture);
            var sequencePath = parse.GetValue(sequence) is { } s ? Path.GetFullPath(s) : ContentRoot.Resolve(context.Root, options.Sequence);
            var unitCount = parse.GetValue(units);
            var slotCount = parse.GetValue(slots);
            if (unitCount < 1)
            {
                return context.BadInput($"--units must be 1 or more, not {unitCount}");
            }

            if (parse.GetValue(firstSerial) is { } first && (first < 1 || first > 999_999 - unitCount + 1))
            {
                return context.BadInput($"--first-serial must be between 1 and {999_999 - unitCount + 1} for {unitCount} units, not {first}");
            }

            if (parse.GetValue(station) is { } stationId && string.IsNullOrWhiteSpace(stationId))
            {
                return context.BadInput("--station must not be empty");
            }

            var fixtureResult = DefinitionFiles.LoadFixture(fixturePath, context.Error);
            if (!fixtureResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var fx = fixtureResult.Value;
            if (fx.Rig != "simulator")
            {
                return context.BadInput($"fixture '{fx.Id}' drives real instruments; demo needs a simulator fixture");
            }

            if (slotCount < 1 || slotCount > fx.Slots.Count)
            {
                return context.BadInput($"--slots must be between 1 and {fx.Slots.Count} (the slots of fixture '{fx.Id}'), not {slotCount}");
            }

            var sequenceResult = DefinitionFiles.LoadSequence(sequencePath, fx, context.Error);
            if (!sequenceResult.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            if (SimulatedUnitDesign.ForProduct(sequenceResult.Value.Product) is null)
            {
                return context.BadInput(
                    $"sequence '{sequenceResult.Value.Id}' tests '{sequenceResult.Value.Product}', but the simulator builds only {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}");
            }

            var stationCount = parse.GetValue(stations);
            if (stationCount < 1 || stationCount > MultiStationDemo.MaxStations)
            {
                return context.BadInput($"--stations must be between 1 and {MultiStationDemo.MaxStations}, not {stationCount}");
            }

            var asJson = parse.GetValue(json);

            // A person reads the unit lines and the summary: log events go to the log file (and to the console only
            // with --verbose), stamped with the shift's simulated time.
            context.Logging.ConsoleOpen = parse.GetValue(verbose);
            var lines = asJson ? context.Error : context.Output;
            var resultsFolder = Path.GetFullPath(parse.GetValue(results)!);
            var shiftOptions = new ShiftOptions
            {
                Fixture = fx,
                Sequence = sequenceResult.Value,
                SequenceSha256 = sequenceResult.Sha256,
                Units = unitCount,
                Slots = slotCount,
                Seed = parse.GetValue(seed),
                ResultsDirectory = resultsFolder,
                Station = parse.GetValue(station) ?? options.Id,
                FirstSerial = parse.GetValue(firstSerial),
                Lot = parse.GetValue(lot) ?? options.Lot,
                Serial = parse.GetValue(serial),
                Mode = parse.GetValue(production) ? ProductionGate.Production : options.Mode,
                SequenceFile = sequencePath,
                Notice = lines.WriteLine,
                ClockStarted = c => context.Logging.Clock = c,
            };
            if (stationCount > 1 || parse.GetValue(factory) is not null)
            {
                // Each station of the demo takes its own folder's writer lock.
                return await MultiStationDemo.RunAsync(context, shiftOptions, stationCount, parse.GetValue(factory), asJson, ct).ConfigureAwait(false);
            }

            using var writer = WriterLock.TakeOrRefuse(resultsFolder, context.Clock, context.Error);
            if (writer is null)
            {
                return ExitCodes.RuntimeFailure;
            }

            var shift = new SimulatedShift(shiftOptions, context.Loggers);
            ShiftSummary summary;
            try
            {
                summary = await shift.RunAsync(run => lines.WriteLine(UnitLine(run)), ct).ConfigureAwait(false);
            }
            catch (Exception ex) when (ex is ResultStoreException or RunStorageException)
            {
                context.Error.WriteLine($"linetest: results could not be stored, the shift was stopped: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }
            catch (PlatformNotSupportedException ex)
            {
                context.Error.WriteLine($"linetest: --serial cannot run here: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }
            finally
            {
                context.Logging.ConsoleOpen = true;
                context.Logging.Clock = null;
            }

            if (shift.Unplaced is { } unplaced)
            {
                return context.BadInput($"the shift does not fit before now: {unplaced}");
            }

            if (shift.Refusal is { } refusal)
            {
                return context.BadInput($"production mode refuses the sequence: {refusal}");
            }

            if (shift.Stopped is { } stopped)
            {
                context.Error.WriteLine($"linetest: the shift {stopped}; the runs before the stop are stored");
            }

            summary = summary with { Head = Storage.Proof.HeadFile.Read(resultsFolder).Head?.Current.Anchor };
            if (asJson)
            {
                context.Output.WriteLine(JsonSerializer.Serialize(summary));
            }
            else
            {
                WriteSummary(context.Output, summary);
                context.Output.WriteLine(ResultsHeadLine.For(resultsFolder));
            }

            return shift.Stopped is null ? ExitCodes.Done : ExitCodes.RuntimeFailure;
        });
        return command;
    }

    /// <summary>One line per unit: serial, slot, verdict and the reason for a failure.</summary>
    public static string UnitLine(RunRecord run)
    {
        ArgumentNullException.ThrowIfNull(run);
        var line = string.Create(CultureInfo.InvariantCulture, $"{run.Serial,-20} slot {run.Slot}  {run.Verdict.ToWord().ToUpperInvariant(),-5}");
        return run.Reason is null ? line : $"{line}  {run.Reason}";
    }

    private static void WriteSummary(TextWriter output, ShiftSummary s)
    {
        var inv = CultureInfo.InvariantCulture;
        output.WriteLine();
        output.WriteLine(string.Create(inv, $"Units {s.Units}: {s.Pass} pass, {s.Fail} fail, {s.Error} error"));
        output.WriteLine(string.Create(inv, $"First-pass yield {s.FirstPassYield * 100:F1} %"));
        var sim = TimeSpan.FromSeconds(s.SimulatedSeconds);
        output.WriteLine(string.Create(inv, $"Simulated time {(int)sim.TotalHours} h {sim.Minutes:D2} min ({s.SimulatedSeconds:F0} s), wall time {s.WallSeconds:F1} s"));
        output.WriteLine($"Results appended to {s.ResultsPath}");
    }
}
