using System.Diagnostics;
using LineTest.Core.Results;
using LineTest.Core.Units;
using LineTest.Runtime.Batches;
using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.Station.Hosting;
using LineTest.Storage.History;
using LineTest.TestSupport;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// Failures surface: what broke was an exception inside the station service that logged "BackgroundService failed",
/// left the units with no verdict and exited 0, and a stop that ended with exit 0.
/// </summary>
public sealed class StationFailureTests
{
    [Fact]
    public async Task ExecuteAsync_ExceptionMidBatch_RunsStoredAsErrorWithTheReasonAndExitOne()
    {
        var results = Path.Combine(Some.TempDirectory(), "results");
        var output = new StringWriter();
        var error = new StringWriter();
        // The fault comes as the source starts for the first setpoint, with both runs under way. (It came at Soaking
        // before: at 4000 × real time a loaded machine could not take the stability readings within the timeout, the
        // units ended as errors of an unstable source, Soaking never came, and the exit code was 0.)
        var context = new StationServiceContext(RepoFiles.Root, Options(results), new StringReader("CTP40A-2612-000501\nCTP40A-2612-000502\n\n"), output, error)
        {
            Observe = screen => new FailingObserver(screen, UnitState.WaitingForSource),
        };
        using var lifetime = new StoppingLifetime();
        var service = new StationService(context, NullLoggerFactory.Instance, lifetime);

        await service.StartAsync(CancellationToken.None);
        await service.ExecuteTask!.WaitAsync(TimeSpan.FromSeconds(60));

        Assert.Equal(ExitCodes.RuntimeFailure, service.ExitCode);
        Assert.Contains("STOPPED: the station failed: the screen feed broke", error.ToString(), StringComparison.Ordinal);
        Assert.True(lifetime.Stopped);
        foreach (var serial in new[] { "CTP40A-2612-000501", "CTP40A-2612-000502" })
        {
            var run = Assert.Single(await new SerialHistoryReader(results).ReadAsync(serial, CancellationToken.None));
            Assert.Equal(Verdict.Error, run.Verdict);
            Assert.Equal("station fault: the screen feed broke", run.Reason);
        }
    }

    [LinuxFact]
    public async Task Run_SigtermMidBatch_Exit143WithRunsStoredAsCancelledErrors()
    {
        var results = Path.Combine(Some.TempDirectory(), "results");
        using var station = new StationProcess(Some.TempDirectory(), new Dictionary<string, string>
        {
            ["Station:Fixture"] = RepoFiles.Path("fixtures/sim-dryblock-4.json"),
            ["Station:Sequence"] = RepoFiles.Path("sequences/ctp40a-dac.json"),
            ["Station:Results"] = results,
            ["Station:SimulatorSpeed"] = "20",
            ["Serilog:MinimumLevel:Default"] = "Warning",
        });
        await station.WaitForAsync("Scan the serial for slot 1");
        station.Type("CTP40A-2612-000511");
        station.Type("CTP40A-2612-000512");
        station.Type(string.Empty);
        await station.WaitForAsync("Batch of 2 started");

        using (var kill = Process.Start("kill", ["-TERM", station.Id.ToString(System.Globalization.CultureInfo.InvariantCulture)]))
        {
            await kill.WaitForExitAsync();
        }

        Assert.Equal(ExitCodes.Terminated, await station.WaitForExitAsync());
        Assert.DoesNotContain("then scan the next", station.Output.Split("Batch of 2 started")[1], StringComparison.Ordinal);
        foreach (var serial in new[] { "CTP40A-2612-000511", "CTP40A-2612-000512" })
        {
            var run = Assert.Single(await new SerialHistoryReader(results).ReadAsync(serial, CancellationToken.None));
            Assert.Equal(Verdict.Error, run.Verdict);
            Assert.StartsWith("cancelled", run.Reason, StringComparison.Ordinal);
        }
    }

    private static StationOptions Options(string results) => new()
    {
        Fixture = RepoFiles.Path("fixtures/sim-dryblock-4.json"),
        Sequence = RepoFiles.Path("sequences/ctp40a-dac.json"),
        Results = results,
        SimulatorSpeed = 4000,
    };

    private sealed class FailingObserver(IBatchObserver inner, UnitState failAt) : IBatchObserver
    {
        public void UnitChanged(int slot, string serial, UnitState state, string step, int stepIndex, int stepCount)
        {
            inner.UnitChanged(slot, serial, state, step, stepIndex, stepCount);
            if (state == failAt)
            {
                throw new InvalidOperationException("the screen feed broke");
            }
        }

        public void UnitFinished(RunRecord run) => inner.UnitFinished(run);

        public void SourceChanged(double? setpointC, double? referenceC, string phase) => inner.SourceChanged(setpointC, referenceC, phase);
    }

    private sealed class StoppingLifetime : IHostApplicationLifetime, IDisposable
    {
        private readonly CancellationTokenSource _stopping = new();

        public bool Stopped => _stopping.IsCancellationRequested;

        public CancellationToken ApplicationStarted => CancellationToken.None;

        public CancellationToken ApplicationStopping => _stopping.Token;

        public CancellationToken ApplicationStopped => CancellationToken.None;

        public void StopApplication() => _stopping.Cancel();

        public void Dispose() => _stopping.Dispose();
    }
}
