namespace LineTest.Reports.Tests.Support;

/// <summary>A fact that runs only where Debian's headless Chromium is installed (.ci/run installs it).</summary>
[AttributeUsage(AttributeTargets.Method)]
public sealed class ChromiumFactAttribute : FactAttribute
{
    public const string ChromiumPath = "/usr/bin/chromium";

    public ChromiumFactAttribute()
    {
        if (!File.Exists(ChromiumPath))
        {
            Skip = $"{ChromiumPath} is not installed (apt-get install chromium); the page is not rendered in a browser.";
        }
    }
}
