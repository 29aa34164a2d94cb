using System.Text.RegularExpressions;
using LineTest.Rig.Serial.Pty;
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
        Assert.Contains("scanner on /dev/ttyACM0: port /dev/ttyACM0 does not exist", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("Probing fixture rig-dryblock-4: 9 instruments", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("0 usable, 9 unusable", run.Stdout, StringComparison.Ordinal);
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

    [LinuxFact]
    public async Task Probe_SimulatorFixtureWithSerialScanner_ProbesTheScannerAndShowsTheCode()
    {
        var work = Some.TempDirectory();
        using var pty = PseudoTerminal.Open(Path.Combine(work, "scanner"));
        var fixture = Path.Combine(work, "fixture.json");
        var text = await File.ReadAllTextAsync(RepoFiles.Path("fixtures/sim-dryblock-4.json"));
        await File.WriteAllTextAsync(fixture, text.Replace("  \"slots\": [",
            $"  \"scanner\": {{ \"kind\": \"serial\", \"port\": {{ \"name\": \"{pty.PortName}\", \"timeoutMs\": 500 }} }},\n  \"slots\": [", StringComparison.Ordinal));

        var probe = RunAsync("probe", "--fixture", fixture, "--scan-wait", "30");
        for (var i = 0; i < 500 && !IsOpenHere(pty.SlavePath); i++)
        {
            await Task.Delay(10);
        }

        pty.Master.Write("\nCTP40A-2612-000042\r\n"u8);
        var run = await probe;

        Assert.Equal(ExitCodes.Done, run.ExitCode);
        Assert.Contains("its serial scanner only (add --serial", run.Stdout, StringComparison.Ordinal);
        Assert.Matches($@"scanner\s+{Regex.Escape(pty.PortName)}\s+ok\s+listens only; scanned 'CTP40A-2612-000042'", run.Stdout);
        Assert.Contains("1 instruments: 1 usable, 0 unusable", run.Stdout, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("0")]
    [InlineData("-1")]
    [InlineData("601")]
    public async Task Probe_ScanWaitOutOfRange_ExitTwo(string seconds)
    {
        var run = await RunAsync("probe", "--fixture", RepoFiles.Path("fixtures/rig-dryblock-4.json"), "--scan-wait", seconds);

        Assert.Equal(ExitCodes.BadInput, run.ExitCode);
        Assert.Contains("--scan-wait", run.Stderr, StringComparison.Ordinal);
    }

    private static bool IsOpenHere(string slave)
        => Directory.EnumerateFileSystemEntries("/proc/self/fd").Any(fd =>
        {
            try
            {
                return File.ResolveLinkTarget(fd, returnFinalTarget: false)?.FullName == slave;
            }
            catch (IOException)
            {
                return false;
            }
        });

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
