using System.CommandLine;
using LineTest.Storage.Store;
using LineTest.Web.Access;
using LineTest.Web.Data;
using LineTest.Web.Hosting;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest serve</c>: the live read-only page for quality engineers and supervisors (line now, yield, capability,
/// unit history) over one or more results folders or the factory database. Listens on 127.0.0.1 unless told otherwise; any other address
/// needs a credential in <c>Station:Web</c>, or the command refuses to start (exit 2).
/// </summary>
public static class ServeCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string[]>("--results") { Description = "Results folder with results.db, one tile per folder (repeatable; default Station:Results)" };
        var factory = new Option<string?>("--factory") { Description = "Read the factory database (an Npgsql connection string) instead of results folders: one tile per station that forwards to it" };
        var listen = new Option<string?>("--listen") { Description = "ADDR:PORT to listen on (default Station:Web:Listen, else 127.0.0.1:5080); other than loopback needs a credential" };
        var hashToken = new Option<bool>("--hash-token") { Description = "Read an access token from standard input and print the Station:Web:TokenSha256 value for it" };
        var hashPassword = new Option<bool>("--hash-password") { Description = "Read a password from standard input and print the Station:Web:PasswordHash value for it" };
        var command = new Command("serve", "Live read-only page: line now, yield, capability and unit history")
        {
            results, factory, listen, hashToken, hashPassword,
        };
        command.SetAction(async (parse, ct) =>
        {
            if (parse.GetValue(hashToken) || parse.GetValue(hashPassword))
            {
                var secret = Console.In.ReadLine();
                if (string.IsNullOrEmpty(secret))
                {
                    return context.BadInput("give the secret on standard input (one line)");
                }

                context.Output.WriteLine(parse.GetValue(hashToken) ? SecretHash.Sha256Hex(secret) : SecretHash.HashPassword(secret));
                return ExitCodes.Done;
            }

            var options = new WebPageOptions();
            context.Configuration.GetSection(WebPageOptions.Section).Bind(options);
            var listenText = parse.GetValue(listen) ?? options.Listen;
            string? listenError = null;
            var address = listenText is null ? ListenAddress.Default : ListenAddress.Parse(listenText, out listenError);
            if (address is null)
            {
                return context.BadInput((parse.GetValue(listen) is null ? "Station:Web:Listen " : "--listen ") + listenError);
            }

            var (shifts, shiftError, shiftWarning) = ShiftSettings.Read(context.Configuration);
            var problems = options.Validate(address).Concat(shiftError is null ? [] : [shiftError]).ToList();
            if (problems.Count > 0)
            {
                context.Error.WriteLine("linetest: serve cannot start:");
                foreach (var problem in problems)
                {
                    context.Error.WriteLine($"  {problem}");
                }

                return ExitCodes.BadInput;
            }

            var given = parse.GetValue(results) ?? [];
            IResultsSource? source;
            int failed;
            if (parse.GetValue(factory) is not { } connection)
            {
                (source, failed) = OpenFolders(context, given);
            }
            else if (given.Length > 0)
            {
                return context.BadInput("give either --results or --factory, not both");
            }
            else
            {
                (source, failed) = await OpenFactoryAsync(context, connection, ct).ConfigureAwait(false);
            }

            if (source is null)
            {
                return failed;
            }

            if (shiftWarning is not null)
            {
                ShiftSettings.LogDeprecation(context.Loggers.CreateLogger(typeof(ShiftSettings)), shiftWarning);
            }

            await using var owned = source as IAsyncDisposable;
            var setup = new WebPageSetup(address, options, source) { Time = context.Clock, Loggers = context.Loggers, Shifts = shifts! };
            int CannotListen(string why)
            {
                context.Error.WriteLine($"linetest: serve cannot listen on {address}: {why}");
                return ExitCodes.RuntimeFailure;
            }

            if (WebPageApp.CannotListen(address) is { } reason)
            {
                return CannotListen(reason);
            }

            await using var app = WebPageApp.Create(setup);
            try
            {
                await app.StartAsync(ct).ConfigureAwait(false);
            }
            catch (IOException ex)
            {
                // The port was taken between the look and the start.
                return CannotListen(ex.Message);
            }

            foreach (var url in WebPageApp.Addresses(app))
            {
                context.Output.WriteLine($"Live page on {url} (read-only), reading {setup.Source.Description}. Ctrl+C stops it.");
            }

            try
            {
                await Task.Delay(Timeout.Infinite, ct).ConfigureAwait(false);
            }
            catch (OperationCanceledException)
            {
                // Ctrl+C.
            }

            await app.StopAsync(CancellationToken.None).ConfigureAwait(false);
            return ExitCodes.Done;
        });
        return command;
    }

    private static (IResultsSource? Source, int ExitCode) OpenFolders(CliContext context, string[] given)
    {
        var folders = (given.Length == 0 ? [Path.Combine(context.Root, context.Options.Results)] : given).Select(Path.GetFullPath).ToList();
        foreach (var folder in folders.Where(f => !Directory.Exists(f)))
        {
            return (null, context.BadInput($"the results folder '{folder}' does not exist"));
        }

        return (new SqliteFolderSource(folders), ExitCodes.Done);
    }

    /// <summary>The factory database, read once before the page starts so a wrong address or database is said at once.</summary>
    private static async Task<(IResultsSource? Source, int ExitCode)> OpenFactoryAsync(CliContext context, string connectionString, CancellationToken ct)
    {
        FactoryDatabaseSource source;
        try
        {
            source = FactoryDatabaseSource.Create(connectionString, context.Clock);
        }
        catch (ArgumentException ex)
        {
            return (null, context.BadInput($"--factory is not a usable connection string: {ex.Message}"));
        }

        try
        {
            await source.ReadProductsAsync(ct).ConfigureAwait(false);
            return (source, ExitCodes.Done);
        }
        catch (ResultStoreException ex)
        {
            await source.DisposeAsync().ConfigureAwait(false);
            context.Error.WriteLine($"linetest: serve cannot read the factory database: {ex.Message}");
            return (null, ex.Failure == ResultStoreFailure.Incompatible ? ExitCodes.BadInput : ExitCodes.RuntimeFailure);
        }
    }
}
