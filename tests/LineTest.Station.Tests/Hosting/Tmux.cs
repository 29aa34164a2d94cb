using System.Diagnostics;

namespace LineTest.Station.Tests.Hosting;

/// <summary>Drives tmux for terminal end-to-end tests: start a session, read its screen, end it.</summary>
internal static class Tmux
{
    public static string Run(params string[] args)
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

    public static async Task<string> WaitForScreenAsync(string session, string text, TimeSpan timeout)
    {
        var deadline = Stopwatch.StartNew();
        var screen = string.Empty;
        while (deadline.Elapsed < timeout)
        {
            screen = Run("capture-pane", "-p", "-t", session);
            if (screen.Contains(text, StringComparison.Ordinal))
            {
                return screen;
            }

            await Task.Delay(250);
        }

        throw new TimeoutException($"'{text}' did not appear within {timeout.TotalSeconds} s. Screen:\n{screen}");
    }

    public static void TryKill(string session)
    {
        try
        {
            Run("kill-session", "-t", session);
        }
        catch (InvalidOperationException)
        {
            // Already gone.
        }
    }
}
