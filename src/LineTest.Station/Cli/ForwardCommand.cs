using System.CommandLine;
using System.Globalization;
using LineTest.Factory.Forwarding;
using LineTest.Factory.Schema;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Extensions.Logging;
using Npgsql;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest forward --results DIR --factory CONN</c>: drains a station's results folder into the factory database
/// by hand (e.g. a station's disk brought to the office). The same door checks as the station's own forwarder: runs
/// already held are counted once, changed or forged runs are refused and recorded as alarms. Exit 0 when everything
/// was forwarded, 1 when the server failed or refused runs, 2 on bad input.
/// </summary>
public static class ForwardCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string>("--results") { Description = "Results folder holding results.db", DefaultValueFactory = _ => "results" };
        var factory = new Option<string>("--factory") { Description = "Factory database (Npgsql connection string, e.g. Host=db1;Username=station;Database=linetest)", Required = true };
        var command = new Command("forward", "Forward a results folder's runs to the factory database now") { results, factory };
        command.SetAction(async (parse, ct) =>
        {
            var directory = Path.GetFullPath(parse.GetValue(results)!);
            if (!File.Exists(ResultsDatabase.PathIn(directory)))
            {
                return context.BadInput($"no results database at {ResultsDatabase.PathIn(directory)}");
            }

            NpgsqlDataSource dataSource;
            try
            {
                dataSource = FactoryConnection.Create(parse.GetValue(factory)!);
            }
            catch (ArgumentException ex)
            {
                return context.BadInput($"--factory is not a usable connection string: {ex.Message}");
            }

            await using (dataSource)
            {
                var where = FactoryConnection.Describe(dataSource);
                var forwarder = new FactoryForwarder(dataSource, context.Clock, context.Loggers.CreateLogger<FactoryForwarder>());
                try
                {
                    await using var outbox = SqliteOutbox.Open(directory);
                    var result = await forwarder.ForwardAsync(outbox, ct).ConfigureAwait(false);
                    var backlog = await outbox.ReadBacklogAsync(await forwarder.EnsureReadyAsync(ct).ConfigureAwait(false), ct).ConfigureAwait(false);
                    context.Output.WriteLine(string.Create(
                        CultureInfo.InvariantCulture,
                        $"{ResultsDatabase.PathIn(directory)} -> {where}: {result.Stored} stored, {result.Duplicates} already held, {result.Refused} refused; forwarded through seq {backlog.ForwardedThroughSeq}, {backlog.Count} waiting"));
                    if (result.Refused > 0)
                    {
                        context.Error.WriteLine($"linetest: {result.Refused} run(s) were refused by the factory database and recorded in its alarms table: they differ from what it holds or are not the station's unedited record");
                        return ExitCodes.RuntimeFailure;
                    }

                    return ExitCodes.Done;
                }
                catch (ResultStoreException ex)
                {
                    return context.BadInput(ex.Message);
                }
                catch (Exception ex) when (ex is NpgsqlException or FactorySchemaException or FactoryConflictException or TimeoutException)
                {
                    context.Error.WriteLine($"linetest: {where}: {ex.Message}. Nothing after the last committed batch was marked forwarded; run forward again.");
                    return ExitCodes.RuntimeFailure;
                }
            }
        });
        return command;
    }
}
