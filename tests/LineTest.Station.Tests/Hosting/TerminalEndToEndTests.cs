using System.Diagnostics;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// Drives <c>linetest run</c> in a real terminal (tmux) as an operator would: types serials as a keyboard-wedge
/// scanner does, starts the batch and reads the verdicts from the captured screen.
/// </summary>
public sealed class TerminalEndToEndTests
{
    [TmuxFact]
    public async Task Run_UnderTmux_ScannedUnitsGetVerdictsOnTheScreen()
    {
        var work = Some.TempDirectory();
        var session = "linetest-e2e-" + Guid.NewGuid().ToString("N")[..8];
        var dll = Path.Combine(AppContext.BaseDirectory, "linetest.dll");
        var env = string.Join(' ',
            $"LINETEST_Station__Fixture={RepoFiles.Path("fixtures/sim-dryblock-4.json")}",
            $"LINETEST_Station__Sequence={RepoFiles.Path("sequences/ctp40a-dac.json")}",
            $"LINETEST_Station__Results={Path.Combine(work, "results")}",
            "LINETEST_Station__SimulatorSpeed=4000",
            "LINETEST_Serilog__MinimumLevel__Default=Warning");
        try
        {
            Tmux("new-session", "-d", "-s", session, "-x", "80", "-y", "24", "-c", work, $"env {env} dotnet {dll} run; sleep 60");
            await WaitForScreenAsync(session, "Scan the serial", TimeSpan.FromSeconds(60));
            foreach (var serial in new[] { "CTP40A-2612-000901", "CTP40A-2612-000902" })
            {
                Tmux("send-keys", "-t", session, serial, "Enter");
                await Task.Delay(300);
            }

            Tmux("send-keys", "-t", session, "Enter");
            var screen = await WaitForScreenAsync(session, "Batch done", TimeSpan.FromSeconds(120));

            Assert.Contains("CTP40A-2612-000901", screen, StringComparison.Ordinal);
            Assert.Contains("CTP40A-2612-000902", screen, StringComparison.Ordinal);
            var verdicts = new[] { "PASS", "FAIL", "ERROR" }.Sum(v => CountOf(screen, v));
            Assert.True(verdicts >= 2, "both slots show a verdict:\n" + screen);
        }
        finally
        {
            try
            {
                Tmux("kill-session", "-t", session);
            }
            catch (InvalidOperationException)
            {
                // Already gone.
            }
        }
    }

    private static int CountOf(string text, string word)
    {
        var count = 0;
        for (var i = text.IndexOf(word, StringComparison.Ordinal); i >= 0; i = text.IndexOf(word, i + word.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }

    private static async Task<string> WaitForScreenAsync(string session, string text, TimeSpan timeout)
    {
        var deadline = Stopwatch.StartNew();
        var screen = string.Empty;
        while (deadline.Elapsed < timeout)
        {
            screen = Tmux("capture-pane", "-p", "-t", session);
            if (screen.Contains(text, StringComparison.Ordinal))
            {
                return screen;
            }

            await Task.Delay(250);
        }

        throw new TimeoutException($"'{text}' did not appear within {timeout.TotalSeconds} s. Screen:\n{screen}");
    }

    private static string Tmux(params string[] args)
    {
        var start = new ProcessStartInfo("tmux") { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEnd();
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0)
        {
            throw new InvalidOperationException($"tmux {string.Join(' ', args)} failed: {error}");
        }

        return output;
    }
}
