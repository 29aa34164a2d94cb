using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.TestSupport;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Cli;

public sealed class ProbeCommandTests
{
    [LinuxFact]
    public async Task Probe_FixtureNamingPortsThatDoNotExist_ExitOneSayingWhichPortIsMissing()
    {
        var run = await RunAsync("probe", "--fixture", RepoFiles.Path("fixtures/rig-dryblock-4.json"));

        Assert.Equal(ExitCodes.RuntimeFailure, run.ExitCode);
        Assert.Contains("source on /dev/ttyUSB0: port /dev/ttyUSB0 does not exist", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("unit slot 4 on /dev/ttyUSB6: port /dev/ttyUSB6 does not exist", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("0 usable, 8 unusable", run.Stdout, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task Probe_SimulatedFixtureOverSerial_ListsEveryInstrumentUsable()
    {
        var run = await RunAsync("probe", "--fixture", RepoFiles.Path("fixtures/sim-dryblock-4.json"), "--serial");

        Assert.Equal(ExitCodes.Done, run.ExitCode);
        foreach (var instrument in new[] { "source", "reference", "meter", "unit slot 1", "unit slot 2", "unit slot 3", "unit slot 4" })
        {
            Assert.Contains(instrument, run.Stdout, StringComparison.Ordinal);
        }

        Assert.Contains("simulated scanning DMM", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("8 usable, 0 unusable", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Probe_SimulatorFixtureWithoutSerial_ExitTwoSayingToAddSerial()
    {
        var run = await RunAsync("probe", "--fixture", RepoFiles.Path("fixtures/sim-dryblock-4.json"));

        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("add --serial", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Probe_BadFixtureFile_ExitTwoWithTheProblem()
    {
        var path = Path.Combine(Path.GetTempPath(), $"linetest-bad-fixture-{Guid.NewGuid():N}.json");
        await File.WriteAllTextAsync(path, "{ \"id\": \"x\" }");
        try
        {
            var run = await RunAsync("probe", "--fixture", path);

            Assert.Equal(ExitCodes.BadInput, run.ExitCode);
            Assert.Contains("missing required propert", run.Stderr, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    private static async Task<RunResult> RunAsync(params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var context = new CliContext(RepoFiles.Root, new ConfigurationBuilder().Build(), new StationOptions(), stdout, stderr, NullLoggerFactory.Instance);
        var exitCode = await StationCommandLine.InvokeAsync(context, args, default);
        return new RunResult(exitCode, stdout.ToString(), stderr.ToString());
    }

    private sealed record RunResult(int ExitCode, string Stdout, string Stderr);
}
