using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

/// <summary>
/// <c>demo</c> as a newcomer runs it (a real process with the shipped appsettings.json). What broke: every unit line
/// was wrapped in two INF log lines on the console, all stamped with the same wall-clock second while hours of
/// simulated time passed.
/// </summary>
public sealed class DemoOutputTests
{
    [LinuxFact]
    public async Task Demo_DefaultSettings_UnitLinesAndSummaryOnlyAndLogFileInSimulatedTime()
    {
        var work = Some.TempDirectory();
        var wallStart = DateTimeOffset.UtcNow;

        var (exit, output, error) = await RunAsync(work, "demo", "--units", "4", "--results", Path.Combine(work, "results"));

        Assert.True(exit == 0, error);
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        Assert.Equal(4, lines.Count(l => l.StartsWith("CTP40A-", StringComparison.Ordinal)));
        Assert.Contains(lines, l => l.StartsWith("Units 4:", StringComparison.Ordinal));
        Assert.DoesNotMatch(@"\d\d:\d\d:\d\d (INF|WRN|ERR) ", output + error);

        var stamps = Directory.GetFiles(Path.Combine(work, "logs"))
            .SelectMany(File.ReadAllLines)
            .Select(l => JsonDocument.Parse(l).RootElement.GetProperty("@t").GetString()!)
            .Select(t => DateTimeOffset.Parse(t, CultureInfo.InvariantCulture))
            .ToList();
        Assert.NotEmpty(stamps);
        var span = stamps.Max() - stamps.Min();
        Assert.True(span > TimeSpan.FromMinutes(20), $"log events span {span} of a simulated batch of about 40 minutes");
        // A demo's shift is laid out to end before now (an empty folder's first shift starts a week back), so events
        // stamped with the simulated clock lie well before the wall clock's start.
        Assert.True(stamps.Min() < wallStart - TimeSpan.FromHours(1), "the events carry the simulated time, not the wall clock");
    }

    [LinuxFact]
    public async Task Demo_Verbose_LogEventsAlsoOnTheConsole()
    {
        var work = Some.TempDirectory();

        var (exit, output, error) = await RunAsync(work, "demo", "--units", "2", "--results", Path.Combine(work, "results"), "--verbose");

        Assert.Equal(0, exit);
        Assert.Matches(@"\d\d:\d\d:\d\d INF Run ended", error);
        Assert.DoesNotMatch(@"\d\d:\d\d:\d\d INF ", output);
    }

    private static async Task<(int Exit, string Output, string Error)> RunAsync(string work, params string[] args)
    {
        File.Copy(RepoFiles.Path("appsettings.json"), Path.Combine(work, "appsettings.json"));
        var start = new ProcessStartInfo("dotnet") { WorkingDirectory = work, RedirectStandardOutput = true, RedirectStandardError = true };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "linetest.dll"));
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        start.Environment["LINETEST_Station__Fixture"] = RepoFiles.Path("fixtures/sim-dryblock-4.json");
        start.Environment["LINETEST_Station__Sequence"] = RepoFiles.Path("sequences/ctp40a-dac.json");
        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(120));
        await process.WaitForExitAsync(cancel.Token);
        return (process.ExitCode, await output, await error);
    }
}
