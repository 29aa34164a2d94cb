using System.CommandLine;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest verify --results DIR</c>: walks the hash chain of the stored runs and checks every readings row
/// against the run it belongs to. Exit 0 when intact, 1 when a run was changed, inserted or deleted (the first
/// one is named), 2 when there is no usable database.
/// </summary>
public static class VerifyCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string>("--results") { Description = "Results folder holding results.db", DefaultValueFactory = _ => "results" };
        var factory = new Option<string?>("--factory") { Description = "Check the factory database (Npgsql connection string) instead; with --results, compare it with that station" };
        var station = new Option<string?>("--station") { Description = "With --factory: only this station" };
        var command = new Command("verify", "Check that no stored run was changed, inserted or deleted") { results, factory, station };
        command.SetAction(async (parse, ct) =>
        {
            if (parse.GetValue(factory) is { } connection)
            {
                var given = parse.GetResult(results) is { Implicit: false } ? Path.GetFullPath(parse.GetValue(results)!) : null;
                return await FactoryVerify.RunAsync(context, connection, parse.GetValue(station), given, ct).ConfigureAwait(false);
            }

            if (parse.GetValue(station) is not null)
            {
                return context.BadInput("--station needs --factory");
            }

            var path = ResultsDatabase.PathIn(Path.GetFullPath(parse.GetValue(results)!));
            if (!File.Exists(path))
            {
                return context.BadInput($"no results database at {path}");
            }

            ChainReport report;
            try
            {
                report = await ChainVerifier.VerifyAsync(path, ct).ConfigureAwait(false);
            }
            catch (Exception ex) when (ex is SqliteException or ResultStoreException or IOException)
            {
                return context.BadInput($"{path} cannot be read as a results database: {ex.Message}");
            }

            if (report.FirstProblem is { } problem)
            {
                context.Output.WriteLine($"{path}: NOT INTACT after checking {report.RunsChecked} runs");
                context.Output.WriteLine($"  first problem: {problem.Kind} at seq {problem.Seq}{(problem.RunId is { } id ? $" (run {id})" : string.Empty)}: {problem.Message}");
                return ExitCodes.RuntimeFailure;
            }

            context.Output.WriteLine($"{path}: intact, {report.RunsChecked} runs, head {report.HeadSha256}");
            return ExitCodes.Done;
        });
        return command;
    }
}
