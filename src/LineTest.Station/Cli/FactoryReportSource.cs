using LineTest.Factory.Reporting;
using LineTest.Factory.Schema;
using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Station.Cli;

/// <summary><c>linetest report --factory CONN</c>: the report's data read from the factory database instead of station folders.</summary>
internal static class FactoryReportSource
{
    /// <summary>Runs to pack from which the report says why it takes longer.</summary>
    internal const long PackNoticeRuns = 100_000;

    /// <summary>The data, or the exit code and message already written when it cannot be loaded.</summary>
    public static async Task<(ReportData? Data, int ExitCode)> LoadAsync(CliContext context, string connectionString, ReportQuery query, CancellationToken ct)
    {
        NpgsqlDataSource dataSource;
        try
        {
            dataSource = FactoryConnection.Create(connectionString);
        }
        catch (ArgumentException ex)
        {
            return (null, context.BadInput($"--factory is not a usable connection string: {ex.Message}"));
        }

        await using (dataSource)
        {
            try
            {
                return (await FactoryReportLoader.LoadPackedAsync(
                    dataSource,
                    query,
                    building: runs =>
                    {
                        // A wait of more than a few seconds is explained (about 15 s per million runs, once).
                        if (runs >= PackNoticeRuns)
                        {
                            context.Error.WriteLine(string.Create(
                                System.Globalization.CultureInfo.InvariantCulture,
                                $"linetest: packing about {runs} runs forwarded since the last factory report, for reports to read (once; about 15 s per million runs)..."));
                        }
                    },
                    ct: ct).ConfigureAwait(false), ExitCodes.Done);
            }
            catch (PostgresException ex) when (ex.SqlState == PostgresErrorCodes.UndefinedTable)
            {
                return (null, context.BadInput($"{FactoryConnection.Describe(dataSource)} is not a LineTest factory database (no runs were ever forwarded to it)"));
            }
            catch (InvalidDataException ex)
            {
                return (null, context.BadInput($"{FactoryConnection.Describe(dataSource)}: {ex.Message}"));
            }
            catch (NpgsqlException ex)
            {
                context.Error.WriteLine($"linetest: {FactoryConnection.Describe(dataSource)} cannot be read: {ex.Message}");
                return (null, ExitCodes.RuntimeFailure);
            }
        }
    }
}
