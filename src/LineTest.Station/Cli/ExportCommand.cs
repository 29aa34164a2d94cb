using System.CommandLine;
using System.Globalization;
using System.Text;
using LineTest.Storage.Csv;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;

namespace LineTest.Station.Cli;

/// <summary><c>linetest export</c>: runs and readings of a results database as CSV files.</summary>
public static class ExportCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var results = new Option<string>("--results") { Description = "Results folder with results.db", DefaultValueFactory = _ => "results" };
        var runs = new Option<string?>("--runs") { Description = "Write one row per run to this CSV file" };
        var readings = new Option<string?>("--readings") { Description = "Write one row per reading to this CSV file" };
        var filters = new ReportFilterOptions();
        var command = new Command("export", "Export runs and readings as CSV (RFC 4180, invariant culture)") { results, runs, readings };
        filters.AddTo(command);
        command.SetAction(async (parse, ct) =>
        {
            var runsPath = parse.GetValue(runs);
            var readingsPath = parse.GetValue(readings);
            if (runsPath is null && readingsPath is null)
            {
                return context.BadInput("give --runs FILE.csv, --readings FILE.csv or both");
            }

            var (query, error) = filters.ToQuery(parse, Reports.Loading.ReportGrouping.None);
            if (query is null)
            {
                return context.BadInput(error!);
            }

            var filter = query.ToRunFilter();
            var exporter = new CsvResultExporter(SqliteResultReader.InDirectory(Path.GetFullPath(parse.GetValue(results)!)));
            try
            {
                if (runsPath is not null)
                {
                    long count;
                    await using (var writer = new StreamWriter(runsPath, append: false, new UTF8Encoding(false)))
                    {
                        count = await exporter.ExportRunsAsync(writer, filter, ct).ConfigureAwait(false);
                    }

                    context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{count} runs written to {Path.GetFullPath(runsPath)}"));
                }

                if (readingsPath is not null)
                {
                    long count;
                    await using (var writer = new StreamWriter(readingsPath, append: false, new UTF8Encoding(false)))
                    {
                        count = await exporter.ExportReadingsAsync(writer, filter, ct).ConfigureAwait(false);
                    }

                    context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{count} readings written to {Path.GetFullPath(readingsPath)}"));
                }
            }
            catch (ResultStoreException ex) when (ex.Failure is not (ResultStoreFailure.Locked or ResultStoreFailure.DiskError))
            {
                return context.BadInput(ex.Message);
            }
            catch (ResultStoreException ex)
            {
                context.Error.WriteLine($"linetest: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                context.Error.WriteLine($"linetest: the export file could not be written: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }

            return ExitCodes.Done;
        });
        return command;
    }
}
