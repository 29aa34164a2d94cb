namespace LineTest.Station.Tests.Hosting;

/// <summary>A fact that needs tmux on Linux; skipped with the reason elsewhere (.ci/run installs tmux).</summary>
public sealed class TmuxFactAttribute : FactAttribute
{
    public TmuxFactAttribute()
    {
        if (!OperatingSystem.IsLinux())
        {
            Skip = "the terminal end-to-end test runs on Linux only";
        }
        else if (!File.Exists("/usr/bin/tmux") && !File.Exists("/usr/local/bin/tmux"))
        {
            Skip = "tmux is not installed (apt-get install -y tmux; .ci/run does this)";
        }
    }
}
