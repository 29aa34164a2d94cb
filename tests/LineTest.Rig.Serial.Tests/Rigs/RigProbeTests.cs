using LineTest.TestSupport;
using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Pty;
using LineTest.Rig.Serial.Rigs;
using LineTest.Rig.Serial.Scanner;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests.Rigs;

public sealed class RigProbeTests
{
    [LinuxFact]
    public async Task RunAsync_SimulatedSerialRigWithUnits_EveryInstrumentUsableWithIdentityAndReading()
    {
        using var h = new SerialHarness();
        h.Load(UnitDefect.None, UnitDefect.None, UnitDefect.None, UnitDefect.None);

        var results = await RigProbe.RunAsync(h.Serial.Drivers, 101, default);

        Assert.Equal(["source", "reference", "meter", "source-measure unit", "unit slot 1", "unit slot 2", "unit slot 3", "unit slot 4"], results.Select(r => r.Instrument));
        Assert.All(results, r =>
        {
            Assert.Equal(ProbeStatus.Usable, r.Status);
            Assert.NotNull(r.Identity);
            Assert.NotNull(r.Reading);
        });
        Assert.Equal(SourceTwin.Identity.ToString(), results[0].Identity);
        Assert.EndsWith("°C", results[0].Reading, StringComparison.Ordinal);
        Assert.Equal(SourceMeterTwin.Identity.ToString(), results[3].Identity);
        Assert.StartsWith("output off:", results[3].Reading, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task RunAsync_EmptySlot_NoUnitNotUnusable()
    {
        using var h = new SerialHarness(unitTimeoutMs: 200);
        h.Load(UnitDefect.None);

        var results = await RigProbe.RunAsync(h.Serial.Drivers, 101, default);

        Assert.Equal(ProbeStatus.Usable, results.Single(r => r.Instrument == "unit slot 1").Status);
        var empty = results.Single(r => r.Instrument == "unit slot 2");
        Assert.Equal(ProbeStatus.NoUnit, empty.Status);
        Assert.Contains("no unit answered in slot 2", empty.Problem, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task RunAsync_MeterErrorQueueRefusesReadings_MeterUnusableQuotingTheQueue()
    {
        using var h = new SerialHarness(retries: 0, timeouts: new() { ["meter"] = 200 });
        h.Serial.Meter.RefuseReadings("-240,\"Hardware error\"");

        var results = await RigProbe.RunAsync(h.Serial.Drivers, 101, default);

        var meter = results.Single(r => r.Instrument == "meter");
        Assert.Equal(ProbeStatus.Unusable, meter.Status);
        Assert.Contains("-240,\"Hardware error\"", meter.Problem, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task RunAsync_PortsThatDoNotExist_EveryInstrumentUnusableSayingSo()
    {
        var fixture = DefinitionFile.Fixture(LineTest.TestSupport.RepoFiles.Path("fixtures/rig-dryblock-4.json"));
        Assert.True(fixture.IsSuccess, string.Join("\n", fixture.Problems));
        var missing = "/dev/linetest-no-such-port-";
        var f = fixture.Value!;
        f = f with
        {
            Source = f.Source with { Port = f.Source.Port! with { Name = missing + "0" } },
            Reference = f.Reference with { Port = f.Reference.Port! with { Name = missing + "1" } },
            Meter = f.Meter with { Port = f.Meter.Port! with { Name = missing + "2" } },
            Slots = [.. f.Slots.Select(s => s with { UnitPort = s.UnitPort! with { Name = missing + "u" + s.Slot } })],
        };
        using var rig = SerialRig.Open(f, NullLoggerFactory.Instance);

        var results = await RigProbe.RunAsync(rig, f.Slots[0].OutputChannel, default);

        Assert.All(results, r =>
        {
            Assert.Equal(ProbeStatus.Unusable, r.Status);
            Assert.Contains($"port {r.Port} does not exist", r.Problem, StringComparison.Ordinal);
        });
    }

    [LinuxFact]
    public async Task ProbeScannerAsync_CodeScannedWhileListening_UsableShowingTheCode()
    {
        var result = await ProbeScannerWithAsync("CTP40A-2612-000042\r"u8.ToArray());

        Assert.Equal(ProbeStatus.Usable, result.Status);
        Assert.Equal("scanned 'CTP40A-2612-000042'", result.Reading);
    }

    [LinuxFact]
    public async Task ProbeScannerAsync_GarbageWhileListening_UnusableNamingTheBaudRate()
    {
        // What a scanner at another baud rate looks like: bytes with the top bit set.
        var result = await ProbeScannerWithAsync([0xC3, 0xF8, 0x9A, 0x0D]);

        Assert.Equal(ProbeStatus.Unusable, result.Status);
        Assert.Contains("non-printable byte 0xC3", result.Problem, StringComparison.Ordinal);
        Assert.Contains("check the scanner's baud rate", result.Problem, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ProbeScannerAsync_NothingScanned_UsableSayingOnlyThatThePortOpens()
    {
        var result = await ProbeScannerWithAsync(null, TimeSpan.FromMilliseconds(300));

        Assert.Equal(ProbeStatus.Usable, result.Status);
        Assert.StartsWith("port opens; nothing scanned within 0.3 s", result.Reading, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task ProbeScannerAsync_PortMissing_UnusableSayingSo()
    {
        using var folder = new PortFolder();
        using var scanner = new SerialScanner(new PortDefinition { Name = folder.Port("none"), TimeoutMs = 100 }, NullLogger.Instance, TimeProvider.System);

        var result = await RigProbe.ProbeScannerAsync(scanner, TimeSpan.FromSeconds(5), default);

        Assert.Equal(ProbeStatus.Unusable, result.Status);
        Assert.Equal("scanner", result.Instrument);
        Assert.Contains("does not exist", result.Problem, StringComparison.Ordinal);
    }

    // Probes a scanner on a pseudo-terminal; once the probe has the port open, writes bytes as the scanner would.
    private static async Task<ProbeResult> ProbeScannerWithAsync(byte[]? bytes, TimeSpan? listen = null)
    {
        using var folder = new PortFolder();
        var pty = PseudoTerminal.Open(folder.Port("scanner"));
        var scanner = new SerialScanner(new PortDefinition { Name = pty.PortName, TimeoutMs = 200 }, NullLogger.Instance, TimeProvider.System);
        try
        {
            var probe = RigProbe.ProbeScannerAsync(scanner, listen ?? TimeSpan.FromSeconds(20), default);
            if (bytes is not null)
            {
                for (var i = 0; i < 500 && !IsOpenHere(pty.SlavePath); i++)
                {
                    await Task.Delay(10);
                }

                // A line end first: anything the terminal held before the port was set up ends there, not in the code.
                pty.Master.Write([(byte)'\n', .. bytes]);
            }

            return await probe;
        }
        finally
        {
            scanner.Dispose();
            pty.Dispose();
        }
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
}
