using System.CommandLine;
using LineTest.Storage.Backup;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest backup --results DIR --to FILE</c>: a consistent copy of results.db through SQLite's online backup API, safe
/// while a station is writing (a plain copy of results.db alone can lose the runs still in its WAL file), with the copy's
/// head in <c>FILE.head</c>. Takes no lock. Exit 0 copied, 1 the copy failed, 2 bad arguments or no database.
/// </summary>
public static class BackupCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string>("--results") { Description = "Results folder holding results.db", DefaultValueFactory = _ => "results" };
        var to = new Option<string>("--to") { Description = "The backup file to create (must not exist; FILE.head is written beside it)", Required = true };
        var command = new Command("backup", "Copy the results database consistently, even while a shift is writing") { results, to };
        command.SetAction(async (parse, ct) =>
        {
            BackupResult result;
            try
            {
                result = await ResultsBackup.CreateAsync(parse.GetValue(results)!, parse.GetValue(to)!, ct).ConfigureAwait(false);
            }
            catch (ResultStoreException ex)
            {
                context.Error.WriteLine($"linetest: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            if (result.Problem is { } problem)
            {
                return context.BadInput(problem);
            }

            if (result.Warning is { } warning)
            {
                context.Error.WriteLine($"linetest: warning: {warning}");
            }

            context.Output.WriteLine($"Backed up {result.Head!.Runs} runs to {result.File} (head {result.Head.Anchor}, in {result.HeadFile})");
            context.Output.WriteLine("To restore: copy it to results.db and its .head file to results.head in an empty results folder, then run 'linetest verify'.");
            return ExitCodes.Done;
        });
        return command;
    }
}
