using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Storage.Csv;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Cli;

public sealed class ExportCommandTests
{
    private static async Task<(int ExitCode, string Stdout, string Stderr)> RunAsync(params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var context = new CliContext(Some.TempDirectory(), new ConfigurationBuilder().Build(), new StationOptions(), stdout, stderr, NullLoggerFactory.Instance);
        var code = await StationCommandLine.InvokeAsync(context, args, CancellationToken.None);
        return (code, stdout.ToString(), stderr.ToString());
    }

    [Fact]
    public async Task Invoke_RunsAndReadings_WritesBothCsvFiles()
    {
        var results = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(results))
        {
            await store.AppendAsync(new RunRecordBuilder().WithSlot(1).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSlot(2).Failing("cold.output", "too high").Build(), CancellationToken.None);
        }

        var runs = Path.Combine(results, "runs.csv");
        var readings = Path.Combine(results, "readings.csv");
        var (code, stdout, _) = await RunAsync("export", "--results", results, "--runs", runs, "--readings", readings);

        Assert.Equal(ExitCodes.Done, code);
        Assert.Contains("2 runs written", stdout, StringComparison.Ordinal);
        var runLines = await File.ReadAllLinesAsync(runs);
        Assert.Equal(string.Join(",", CsvResultExporter.RunHeader), runLines[0]);
        Assert.Equal(3, runLines.Length);

        // RunRecordBuilder gives every run five readings.
        Assert.Equal(1 + 10, (await File.ReadAllLinesAsync(readings)).Length);
    }

    [Fact]
    public async Task Invoke_SlotFilter_ExportsThatSlotOnly()
    {
        var results = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(results))
        {
            await store.AppendAsync(new RunRecordBuilder().WithSlot(1).Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().WithSlot(2).Build(), CancellationToken.None);
        }

        var runs = Path.Combine(results, "runs.csv");
        var (code, _, _) = await RunAsync("export", "--results", results, "--runs", runs, "--slot", "2");

        Assert.Equal(ExitCodes.Done, code);
        Assert.Equal(2, (await File.ReadAllLinesAsync(runs)).Length);
    }

    [Fact]
    public async Task Invoke_NoOutputFile_ExitsTwo()
    {
        var (code, _, stderr) = await RunAsync("export", "--results", Some.TempDirectory());

        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("--runs", stderr, StringComparison.Ordinal);
    }
}
