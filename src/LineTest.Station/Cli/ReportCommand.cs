using System.CommandLine;
using LineTest.Station.Composition;
using System.Text;
using LineTest.Reports.Building;
using LineTest.Reports.Console;
using LineTest.Reports.Csv;
using LineTest.Reports.Fuzzing;
using LineTest.Reports.Html;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.Web.Hosting;
using Microsoft.Extensions.Logging;
using Spectre.Console;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest report</c>: yield, failure Pareto, capability, control charts and slot bias for quality
/// engineers, on the console, as JSON, as CSV and as one HTML page.
/// </summary>
public static class ReportCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context) => Create(context, TimeProvider.System);

    /// <summary>Builds the command with the clock that stamps the report.</summary>
    internal static Command Create(CliContext context, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(time);
        var results = new Option<string[]>("--results") { Description = "Results folder with results.db (repeatable; default ./results)" };
        var readings = new Option<string?>("--readings") { Description = "Readings CSV to report on instead of results databases" };
        var skipBadRows = new Option<bool>("--skip-bad-rows") { Description = "Report on the good rows when some are bad: rows of --readings, damaged runs of --results (each named with its line or seq and reason)" };
        var by = new Option<string?>("--by") { Description = "Group by station, slot, lot, day, revision, operator or shift (shifts from Station:Shifts)" };
        by.AcceptOnlyFromAmong("station", "slot", "lot", "day", "revision", "operator", "shift");
        var fuzz = new Option<int?>("--fuzz") { Description = "Fuzz the report: N damaged copies of the --results database (or mutations of the --readings CSV); prints the figures" };
        var fuzzWorkers = new Option<int>("--fuzz-workers") { Description = "Threads for --fuzz (each with its own seeded inputs and scratch folder)", DefaultValueFactory = _ => 1 };
        var fuzzHtmlEvery = new Option<int>("--fuzz-html-every") { Description = "With --fuzz, write the HTML page (its charts take most of the time) for one input in N; 0 never", DefaultValueFactory = _ => 25 };
        var fuzzSeed = new Option<int>("--fuzz-seed") { Description = "Seed of the --fuzz inputs (the same seed and worker count give the same inputs)", DefaultValueFactory = _ => 1 };
        var firstRuns = new Option<bool>("--first-runs") { Description = "Capability and failure Pareto from each unit's first run only" };
        var json = new Option<bool>("--json") { Description = "Print the report as one JSON object instead of tables" };
        var csv = new Option<string?>("--csv") { Description = "Write the per-reading statistics to this CSV file" };
        var html = new Option<string?>("--html") { Description = "Write the report with charts to this HTML file" };
        var factory = new Option<string?>("--factory") { Description = "Report from the factory database (Npgsql connection string) instead of results folders" };
        var filters = new ReportFilterOptions();
        var command = new Command("report", "Quality report: yield, failures, capability, control charts and slot bias")
        {
            results, readings, skipBadRows, by, firstRuns, json, csv, html, factory, fuzz, fuzzWorkers, fuzzHtmlEvery, fuzzSeed,
        };
        filters.AddTo(command);
        command.SetAction(async (parse, ct) =>
        {
            var grouping = parse.GetValue(by) is { } b ? Enum.Parse<ReportGrouping>(b, ignoreCase: true) : ReportGrouping.None;
            var (query, error) = filters.ToQuery(parse, grouping);
            if (query is null)
            {
                return context.BadInput(error!);
            }

            // The one shift setting, Station:Shifts, as the live page reads it.
            var (shifts, shiftError, shiftWarning) = ShiftSettings.Read(context.Configuration);
            if (shifts is null)
            {
                return context.BadInput($"the settings: {shiftError}");
            }

            if (shiftWarning is not null)
            {
                ShiftSettings.LogDeprecation(context.Loggers.CreateLogger(typeof(ShiftSettings)), shiftWarning);
            }

            query = query with { FirstRunsOnly = parse.GetValue(firstRuns), Shifts = shifts };

            var folders = parse.GetValue(results) ?? [];
            var csvInput = parse.GetValue(readings);
            if (csvInput is not null && folders.Length > 0)
            {
                return context.BadInput("give either --results or --readings, not both");
            }

            if (parse.GetValue(fuzz) is { } iterations)
            {
                return Fuzz(context, iterations, (parse.GetValue(fuzzWorkers), parse.GetValue(fuzzHtmlEvery), parse.GetValue(fuzzSeed)), csvInput, folders);
            }

            var factoryConnection = parse.GetValue(factory);
            if (factoryConnection is not null && (csvInput is not null || folders.Length > 0))
            {
                return context.BadInput("give one of --factory, --results or --readings");
            }

            ReportData data;
            if (factoryConnection is not null)
            {
                var (loaded, exitCode) = await FactoryReportSource.LoadAsync(context, factoryConnection, query, ct).ConfigureAwait(false);
                if (loaded is null)
                {
                    return exitCode;
                }

                data = loaded;
            }
            else if (csvInput is not null)
            {
                var loaded = CsvReadingsLoader.Load(csvInput, query, parse.GetValue(skipBadRows));
                if (loaded.FileError is not null)
                {
                    return context.BadInput(loaded.FileError);
                }

                foreach (var problem in loaded.BadRows.Take(50))
                {
                    context.Error.WriteLine($"linetest: {csvInput} line {problem.Line}: {problem.Reason}");
                }

                if (loaded.BadRows.Count > 50)
                {
                    context.Error.WriteLine($"linetest: ... and {loaded.BadRows.Count - 50} more bad rows");
                }

                if (loaded.Data is null)
                {
                    return context.BadInput($"{csvInput} has {loaded.BadRows.Count} bad row(s); correct them, or add --skip-bad-rows to report on the rest");
                }

                if (loaded.BadRows.Count > 0)
                {
                    context.Error.WriteLine($"linetest: skipped {loaded.BadRows.Count} bad row(s) of {csvInput}");
                    foreach (var problem in loaded.BadRows)
                    {
                        loaded.Data.AddSkippedRow($"line {problem.Line}: {problem.Reason}");
                    }
                }

                data = loaded.Data;
            }
            else
            {
                var directories = (folders.Length == 0 ? ["results"] : folders).Select(Path.GetFullPath).ToList();
                try
                {
                    data = await ResultsLoader.LoadAsync(directories, query, parse.GetValue(skipBadRows), ct).ConfigureAwait(false);
                }
                catch (ResultStoreException ex) when (ex.Failure is not (ResultStoreFailure.Locked or ResultStoreFailure.DiskError))
                {
                    // A missing, foreign or damaged database is bad input: say what is wrong, no stack trace.
                    return context.BadInput(ex.Message);
                }
                catch (ResultStoreException ex)
                {
                    context.Error.WriteLine($"linetest: {ex.Message}");
                    return ExitCodes.RuntimeFailure;
                }

                if (data.SkippedRows.Count > 0)
                {
                    foreach (var skipped in data.SkippedRows.Take(50))
                    {
                        context.Error.WriteLine($"linetest: damaged run {skipped}");
                    }

                    context.Error.WriteLine(data.SkippedRows.Count > 50
                        ? $"linetest: ... and {data.SkippedRows.Count - 50} more; skipped {data.SkippedRows.Count} damaged run(s)"
                        : $"linetest: skipped {data.SkippedRows.Count} damaged run(s)");
                }
            }

            var report = ReportBuilder.Build(data, query, time);
            try
            {
                if (parse.GetValue(csv) is { } csvPath)
                {
                    await using var writer = new StreamWriter(csvPath, append: false, new UTF8Encoding(false));
                    ReadingStatisticsCsvWriter.Write(report, writer);
                }

                if (parse.GetValue(html) is { } htmlPath)
                {
                    await using var writer = new StreamWriter(htmlPath, append: false, new UTF8Encoding(false));
                    HtmlReportWriter.Write(report, writer);
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                context.Error.WriteLine($"linetest: the report file could not be written: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            if (parse.GetValue(json))
            {
                ReportJsonWriter.Write(report, context.Output);
                context.Output.WriteLine();
            }
            else
            {
                // A terminal gets tables fitted to its width; a file or a pipe gets plain text whose cells never wrap.
                var terminal = ReferenceEquals(context.Output, Console.Out) && !Console.IsOutputRedirected;
                var console = AnsiConsole.Create(new AnsiConsoleSettings
                {
                    Out = new AnsiConsoleOutput(context.Output),
                    Ansi = terminal ? AnsiSupport.Detect : AnsiSupport.No,
                    ColorSystem = terminal ? ColorSystemSupport.Detect : ColorSystemSupport.NoColors,
                });
                ReportConsoleWriter.Write(report, console, plain: !terminal);
                foreach (var folder in csvInput is null ? (folders.Length == 0 ? ["results"] : folders) : [])
                {
                    context.Output.WriteLine($"{Path.GetFullPath(folder)}: {ResultsHeadLine.For(folder)}");
                }
            }

            return ExitCodes.Done;
        });
        return command;
    }

    /// <summary>
    /// <c>report --fuzz N</c>: damaged inputs through loading, building and every format; exit 1 when any crashed or
    /// took more than 10 s. The figures in docs/reliability.md come from this.
    /// </summary>
    private static int Fuzz(CliContext context, int iterations, (int Workers, int HtmlEvery, int Seed) how, string? csvInput, string[] folders)
    {
        var (workers, htmlEvery, seed) = how;
        if (htmlEvery < 0)
        {
            return context.BadInput($"--fuzz-html-every must be 0 or more, not {htmlEvery}");
        }

        if (iterations < 1)
        {
            return context.BadInput($"--fuzz must be 1 or more, not {iterations}");
        }

        if (workers is < 1 or > 64)
        {
            return context.BadInput($"--fuzz-workers must be 1 … 64, not {workers}");
        }

        FuzzSummary summary;
        if (csvInput is not null)
        {
            if (!File.Exists(csvInput))
            {
                return context.BadInput($"'{csvInput}' does not exist");
            }

            summary = ReportFuzzer.FuzzCsv(File.ReadAllText(csvInput), iterations, seed, workers, htmlEvery);
        }
        else
        {
            var folder = Path.GetFullPath(folders.Length == 0 ? "results" : folders[0]);
            if (!File.Exists(ResultsDatabase.PathIn(folder)))
            {
                return context.BadInput($"'{folder}' holds no results.db to fuzz");
            }

            summary = ReportFuzzer.FuzzDatabase(folder, iterations, seed, workers, htmlEvery);
        }

        context.Output.WriteLine(string.Create(
            System.Globalization.CultureInfo.InvariantCulture,
            $"{summary.Kind}: {summary.Inputs} inputs, {summary.Reported} reported, {summary.Refused} refused with a reason, {summary.Crashed} crashed, {summary.OverTenSeconds} over 10 s (slowest {summary.SlowestSeconds:F2} s, most processor time in one input {summary.SlowestCpuSeconds:F2} s)"));
        if (summary.FirstCrash is { } crash)
        {
            context.Output.WriteLine($"first crash: {crash}");
        }

        return summary.Crashed == 0 && summary.OverTenSeconds == 0 ? ExitCodes.Done : ExitCodes.RuntimeFailure;
    }
}
