using System.Diagnostics;
using LineTest.Rig.Serial.Pty;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// <c>linetest run</c> with a serial barcode scanner, end to end: the station is a child process, the scanner is the
/// master end of a pseudo-terminal that the fixture names as the scanner's port, and the operator's keyboard is the
/// child's standard input.
/// </summary>
public sealed class ScannerEndToEndTests
{
    [LinuxFact]
    public async Task Run_SerialScanner_CodesGoThroughTheScanRulesLikeTypedOnes()
    {
        var work = Some.TempDirectory();
        var results = Path.Combine(work, "results");

        // History: one serial passed (dated ahead, so it is "today" however far the 4000x simulator clock runs during
        // the test), another failed yesterday.
        await using (var store = SqliteResultStore.Open(results))
        {
            await store.AppendAsync(new RunRecordBuilder().WithSerial("CTP40R-2612-000800").StartedAt(DateTimeOffset.UtcNow.AddDays(2)).Build(), default);
            await store.AppendAsync(new RunRecordBuilder().WithSerial("CTP40R-2612-000801").StartedAt(DateTimeOffset.UtcNow.AddDays(-1))
                .Failing("verify.error", "verify.error above its upper acceptance limit").Build(), default);
        }

        using var scanner = PseudoTerminal.Open(Path.Combine(work, "scanner"));
        var fixture = WriteFixtureWithScanner(work, scanner.PortName);
        using var station = new StationProcess(work, new Dictionary<string, string>
        {
            ["Station:Fixture"] = fixture,
            ["Station:Sequence"] = RepoFiles.Path("sequences/ctp40r-resistor.json"),
            ["Station:Results"] = results,
            ["Station:SimulatorSpeed"] = "4000",
            ["Serilog:MinimumLevel:Default"] = "Warning",
        });
        await station.WaitForAsync("Scan the serial for slot 1");
        await WaitUntilOpenAsync(station, scanner.SlavePath);

        scanner.Master.Write("CTP40R-2612-000901\r\n"u8);
        await station.WaitForAsync("Loaded CTP40R-2612-000901 in slot 1.");

        // Noise on the line (the simulator's meter-garbage bytes), a duplicate, another product's code, a unit that
        // passed today, and one that failed before: each refused or accepted exactly as a typed serial would be.
        scanner.Master.Write([0x7F, 0x00, 0xE5, 0x13, (byte)'\n']);
        await station.WaitForAsync("Refused: a scan with the non-printable byte 0x7F at position 1");
        scanner.Master.Write("CTP40R-2612-000901\r"u8);
        await station.WaitForAsync("Refused: CTP40R-2612-000901 is already loaded in this fixture.");
        scanner.Master.Write("CTP40A-2612-000902\n"u8);
        await station.WaitForAsync("Refused: 'CTP40A-2612-000902' is not a serial of this product");
        scanner.Master.Write("CTP40R-2612-000800\r"u8);
        await station.WaitForAsync("Refused: CTP40R-2612-000800 already passed today");
        scanner.Master.Write("CTP40R-2612-000801\r"u8);
        await station.WaitForAsync("Loaded CTP40R-2612-000801 in slot 2 (retest).");

        // The keyboard still works beside the scanner.
        station.Type("4 CTP40R-2612-000903");
        await station.WaitForAsync("Loaded CTP40R-2612-000903 in slot 4.");
        station.Type(string.Empty);
        await station.WaitForAsync("Batch of 3 started.");

        // The resistor trim asks the operator to fit parts and press Enter: a scan must not answer that prompt.
        var prompt = await station.WaitForAsync("Then press Enter.");
        scanner.Master.Write("CTP40R-2612-000904\r"u8);
        await station.WaitForAsync("Refused: CTP40R-2612-000904 was scanned while a batch runs; scan it again when the batch is done.");
        Assert.Equal(StationProcess.Count(prompt, "Then press Enter."), StationProcess.Count(station.Output, "Then press Enter."));
        var answered = 0;
        var waited = Stopwatch.StartNew();
        while (!station.Output.Contains("Batch done", StringComparison.Ordinal) && waited.Elapsed < TimeSpan.FromSeconds(120))
        {
            for (var asked = StationProcess.Count(station.Output, "Then press Enter."); answered < asked; answered++)
            {
                station.Type(string.Empty);
            }

            await Task.Delay(100);
        }

        var output = await station.WaitForAsync("Batch done");
        foreach (var (serial, slot) in new[] { ("CTP40R-2612-000901", 1), ("CTP40R-2612-000801", 2), ("CTP40R-2612-000903", 4) })
        {
            Assert.Matches($@"{serial}\s+slot {slot}\s+(PASS|FAIL|ERROR)", output);
        }

        station.CloseInput();
        Assert.Equal(0, await station.WaitForExitAsync());
    }

    [TmuxFact]
    public async Task Run_SerialScannerUnderTmux_ScannedSerialsAndRefusalsOnTheScreen()
    {
        var work = Some.TempDirectory();
        using var scanner = PseudoTerminal.Open(Path.Combine(work, "scanner"));
        var fixture = WriteFixtureWithScanner(work, scanner.PortName);
        var session = "linetest-scan-" + Guid.NewGuid().ToString("N")[..8];
        var env = string.Join(' ',
            $"LINETEST_Station__Fixture={fixture}",
            $"LINETEST_Station__Sequence={RepoFiles.Path("sequences/ctp40a-dac.json")}",
            $"LINETEST_Station__Results={Path.Combine(work, "results")}",
            "LINETEST_Serilog__MinimumLevel__Default=Error");
        try
        {
            Tmux.Run("new-session", "-d", "-s", session, "-x", "80", "-y", "24", "-c", work, $"env {env} dotnet {Path.Combine(AppContext.BaseDirectory, "linetest.dll")} run; sleep 60");
            await Tmux.WaitForScreenAsync(session, "Scan the serial", TimeSpan.FromSeconds(60));
            for (var i = 0; i < 600 && !IsOpenAnywhere(scanner.SlavePath); i++)
            {
                await Task.Delay(100);
            }

            scanner.Master.Write("CTP40A-2612-000911\rCTP40A-2612-000912\r"u8);
            await Tmux.WaitForScreenAsync(session, "CTP40A-2612-000912", TimeSpan.FromSeconds(30));
            scanner.Master.Write("CTP40A-2612-000911\r"u8);
            var screen = await Tmux.WaitForScreenAsync(session, "already loaded", TimeSpan.FromSeconds(30));

            Assert.Matches(@"│\s+1\s+│ CTP40A-2612-000911", screen);
            Assert.Matches(@"│\s+2\s+│ CTP40A-2612-000912", screen);
            Assert.Contains("! Refused: CTP40A-2612-000911 is already loaded", screen, StringComparison.Ordinal);
            Assert.Contains("> Scan the serial for slot 3", screen, StringComparison.Ordinal);
        }
        finally
        {
            Tmux.TryKill(session);
        }
    }

    private static string WriteFixtureWithScanner(string folder, string port)
    {
        var text = File.ReadAllText(RepoFiles.Path("fixtures/sim-dryblock-4.json"));
        var withScanner = text.Replace("  \"slots\": [", $"  \"scanner\": {{ \"kind\": \"serial\", \"port\": {{ \"name\": \"{port}\", \"baud\": 9600, \"timeoutMs\": 2000 }} }},\n  \"slots\": [", StringComparison.Ordinal);
        Assert.NotEqual(text, withScanner);
        var path = Path.Combine(folder, "fixture-with-scanner.json");
        File.WriteAllText(path, withScanner);
        return path;
    }

    // The station opens the scanner port once it has started; bytes are sent after that, as a scanner plugged in and
    // triggered by an operator would.
    private static async Task WaitUntilOpenAsync(StationProcess station, string slave)
    {
        for (var i = 0; i < 600 && !station.HasOpen(slave); i++)
        {
            await Task.Delay(100);
        }

        Assert.True(station.HasOpen(slave), "the station never opened the scanner port");
    }

    private static bool IsOpenAnywhere(string slave)
    {
        foreach (var process in Directory.EnumerateDirectories("/proc").Where(d => int.TryParse(Path.GetFileName(d), out _)))
        {
            try
            {
                if (Directory.EnumerateFileSystemEntries(Path.Combine(process, "fd")).Any(fd => File.ResolveLinkTarget(fd, false)?.FullName == slave))
                {
                    return true;
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // Another user's process, or one that just ended.
            }
        }

        return false;
    }
}
