using System.CommandLine;
using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Station.Screen;
using LineTest.Storage.History;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest history SERIAL --results DIR [--json]</c>: every run of one unit, oldest first (time, station, slot,
/// verdict, reason, first failing reading, where the unit went). Exit 0 with or without runs, 2 when there is no usable
/// database.
/// </summary>
public static class HistoryCommand
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);

    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var serial = new Argument<string>("SERIAL") { Description = "The unit's serial" };
        var results = new Option<string>("--results") { Description = "Results folder holding results.db", DefaultValueFactory = _ => "results" };
        var json = new Option<bool>("--json") { Description = "Print the runs as one JSON object" };
        var command = new Command("history", "List every run of one unit") { serial, results, json };
        command.SetAction(async (parse, ct) =>
        {
            var folder = Path.GetFullPath(parse.GetValue(results)!);
            var path = ResultsDatabase.PathIn(folder);
            if (!File.Exists(path))
            {
                return context.BadInput($"no results database at {path}");
            }

            var wanted = parse.GetValue(serial)!.Trim();
            IReadOnlyList<HistoryEntry> runs;
            try
            {
                runs = await new SerialHistoryReader(folder).ReadAsync(wanted, ct).ConfigureAwait(false);
            }
            catch (ResultStoreException ex)
            {
                return context.BadInput($"{path} cannot be read as a results database: {ex.Message}");
            }

            if (parse.GetValue(json))
            {
                context.Output.WriteLine(JsonSerializer.Serialize(new
                {
                    serial = wanted,
                    runs = runs.Select(r => new
                    {
                        endedUtc = r.EndedUtc,
                        station = r.Station,
                        slot = r.Slot,
                        verdict = r.Verdict.ToWord(),
                        reason = r.Reason,
                        firstFailingReading = r.FirstFailingReading,
                        disposition = r.Disposition,
                        lot = r.Lot,
                        @operator = r.Operator,
                        sequenceId = r.SequenceId,
                        sequenceRevision = r.SequenceRevision,
                    }),
                }, Json));
                return ExitCodes.Done;
            }

            if (runs.Count == 0)
            {
                context.Output.WriteLine($"History of {wanted}: no runs stored in {path}.");
                return ExitCodes.Done;
            }

            context.Output.WriteLine(HistoryLines.Title(wanted, runs));
            foreach (var run in runs)
            {
                context.Output.WriteLine(HistoryLines.Line(run));
            }

            return ExitCodes.Done;
        });
        return command;
    }
}
