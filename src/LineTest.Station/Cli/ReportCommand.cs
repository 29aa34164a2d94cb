using System.CommandLine;
using LineTest.Station.Composition;
using System.Text;
using LineTest.Reports.Building;
using LineTest.Reports.Console;
using LineTest.Reports.Csv;
using LineTest.Reports.Html;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using LineTest.Storage.Store;
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
        var skipBadRows = new Option<bool>("--skip-bad-rows") { Description = "Report on the good rows of --readings when some rows are bad" };
        var by = new Option<string?>("--by") { Description = "Group by station, slot, lot, day or revision" };
        by.AcceptOnlyFromAmong("station", "slot", "lot", "day", "revision");
        var json = new Option<bool>("--json") { Description = "Print the report as one JSON object instead of tables" };
        var csv = new Option<string?>("--csv") { Description = "Write the per-reading statistics to this CSV file" };
        var html = new Option<string?>("--html") { Description = "Write the report with charts to this HTML file" };
        var filters = new ReportFilterOptions();
        var command = new Command("report", "Quality report: yield, failures, capability, control charts and slot bias")
        {
            results, readings, skipBadRows, by, json, csv, html,
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

            var folders = parse.GetValue(results) ?? [];
            var csvInput = parse.GetValue(readings);
            if (csvInput is not null && folders.Length > 0)
            {
                return context.BadInput("give either --results or --readings, not both");
            }

            ReportData data;
            if (csvInput is not null)
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
                }

                data = loaded.Data;
            }
            else
            {
                var directories = (folders.Length == 0 ? ["results"] : folders).Select(Path.GetFullPath).ToList();
                try
                {
                    data = await ResultsLoader.LoadAsync(directories, query, ct).ConfigureAwait(false);
                }
                catch (ResultStoreException ex) when (ex.Failure is ResultStoreFailure.CannotOpen or ResultStoreFailure.Incompatible)
                {
                    return context.BadInput(ex.Message);
                }
                catch (ResultStoreException ex)
                {
                    context.Error.WriteLine($"linetest: {ex.Message}");
                    return ExitCodes.RuntimeFailure;
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
                context.Output.WriteLine(ReportJsonWriter.ToJson(report));
            }
            else
            {
                var console = AnsiConsole.Create(new AnsiConsoleSettings
                {
                    Out = new AnsiConsoleOutput(context.Output),
                    Ansi = AnsiSupport.Detect,
                    ColorSystem = ColorSystemSupport.Detect,
                });
                ReportConsoleWriter.Write(report, console);
                foreach (var folder in csvInput is null ? (folders.Length == 0 ? ["results"] : folders) : [])
                {
                    context.Output.WriteLine($"{Path.GetFullPath(folder)}: {ResultsHeadLine.For(folder)}");
                }
            }

            return ExitCodes.Done;
        });
        return command;
    }
}
