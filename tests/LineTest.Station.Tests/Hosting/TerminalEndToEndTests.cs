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
            Tmux.Run("new-session", "-d", "-s", session, "-x", "80", "-y", "24", "-c", work, $"env {env} dotnet {dll} run; sleep 60");
            await Tmux.WaitForScreenAsync(session, "Scan the serial", TimeSpan.FromSeconds(60));
            foreach (var serial in new[] { "CTP40A-2612-000901", "CTP40A-2612-000902" })
            {
                Tmux.Run("send-keys", "-t", session, serial, "Enter");
                await Task.Delay(300);
            }

            Tmux.Run("send-keys", "-t", session, "Enter");
            var screen = await Tmux.WaitForScreenAsync(session, "Batch done", TimeSpan.FromSeconds(120));

            Assert.Contains("CTP40A-2612-000901", screen, StringComparison.Ordinal);
            Assert.Contains("CTP40A-2612-000902", screen, StringComparison.Ordinal);
            var verdicts = new[] { "PASS", "FAIL", "ERROR" }.Sum(v => CountOf(screen, v));
            Assert.True(verdicts >= 2, "both slots show a verdict:\n" + screen);
        }
        finally
        {
            Tmux.TryKill(session);
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
}
