using LineTest.TestSupport;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// <c>linetest run</c> in a real 80×24 terminal (tmux), as an operator sees it: keys typed as a keyboard-wedge scanner
/// types them, the screen read back. The shell prints <c>EXIT=N</c> when the station ends.
/// </summary>
internal sealed class StationTerminal : IDisposable
{
    public static readonly TimeSpan Patience = TimeSpan.FromSeconds(90);

    private StationTerminal(string session, string work, string results)
    {
        Session = session;
        Work = work;
        Results = results;
    }

    public string Session { get; }

    public string Work { get; }

    public string Results { get; }

    /// <summary>Starts the station on the simulated fixture; <paramref name="settings"/> add to or override the Station section.</summary>
    public static StationTerminal Start(double speed, IReadOnlyDictionary<string, string>? settings = null, string? results = null, bool quietLog = false)
    {
        var work = Some.TempDirectory();
        results ??= Path.Combine(work, "results");
        var all = new Dictionary<string, string>
        {
            ["Station__Fixture"] = RepoFiles.Path("fixtures/sim-dryblock-4.json"),
            ["Station__Sequence"] = RepoFiles.Path("sequences/ctp40a-dac.json"),
            ["Station__Results"] = results,
            ["Station__SimulatorSpeed"] = speed.ToString(System.Globalization.CultureInfo.InvariantCulture),
        };
        if (quietLog)
        {
            all["Serilog__MinimumLevel__Default"] = "Warning";
        }

        foreach (var (key, value) in settings ?? new Dictionary<string, string>())
        {
            all[key] = value;
        }

        var env = string.Join(' ', all.Select(kv => $"LINETEST_{kv.Key}='{kv.Value}'"));
        var dll = Path.Combine(AppContext.BaseDirectory, "linetest.dll");
        var session = "linetest-e2e-" + Guid.NewGuid().ToString("N")[..8];
        for (var attempt = 1; ; attempt++)
        {
            try
            {
                Tmux.Run("new-session", "-d", "-s", session, "-x", "80", "-y", "24", "-c", work, $"env {env} dotnet {dll} run; echo EXIT=$?; sleep 120");
                return new StationTerminal(session, work, results);
            }
            catch (InvalidOperationException) when (attempt < 3)
            {
                // The tmux server of another test may be starting or ending at this moment.
                Thread.Sleep(500);
            }
        }
    }

    /// <summary>Types <paramref name="text"/> and Enter.</summary>
    public async Task TypeAsync(string text)
    {
        if (text.Length > 0)
        {
            Tmux.Run("send-keys", "-t", Session, "-l", text);
        }

        Tmux.Run("send-keys", "-t", Session, "Enter");
        await Task.Delay(250);
    }

    /// <summary>Sends a key by its tmux name (e.g. C-c).</summary>
    public void Key(string key) => Tmux.Run("send-keys", "-t", Session, key);

    public string Screen() => Tmux.Run("capture-pane", "-p", "-t", Session);

    /// <summary>
    /// Waits until <paramref name="text"/> is on the screen, also when the terminal wrapped it over lines; returns the
    /// screen with wrapped lines joined (one space where a line broke).
    /// </summary>
    public async Task<string> WaitForAsync(string text)
    {
        var waited = System.Diagnostics.Stopwatch.StartNew();
        var screen = string.Empty;
        while (waited.Elapsed < Patience)
        {
            screen = Screen();
            if (Joined(screen).Contains(text, StringComparison.Ordinal))
            {
                return Joined(screen);
            }

            await Task.Delay(200);
        }

        throw new TimeoutException($"'{text}' did not appear within {Patience.TotalSeconds} s. Screen:\n{screen}");
    }

    /// <summary>The screen with each line's trailing blanks removed and lines that do not start a row joined.</summary>
    public static string Joined(string screen) =>
        System.Text.RegularExpressions.Regex.Replace(
            string.Join("\n", screen.Split('\n').Select(l => l.TrimEnd())), "\n(?![│╭╰├>!]|slot |History|  |LineTest|sequence |block:|CAUTION|HOT|COLD|EXIT)", " ");

    public void Dispose() => Tmux.TryKill(Session);
}
