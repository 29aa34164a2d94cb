namespace LineTest.Web.Tests.Browser;

/// <summary>
/// A fact that drives Debian's Chromium through chromedriver. Outside CI it is skipped, with the reason, when either
/// is missing; in CI (CI=true) it runs and fails saying what is missing, since .ci/run installs both.
/// </summary>
public sealed class BrowserFactAttribute : FactAttribute
{
    public const string Chromium = "/usr/bin/chromium";

    public const string ChromeDriver = "/usr/bin/chromedriver";

    public BrowserFactAttribute()
    {
        if (Missing() is { } missing && !InCi)
        {
            Skip = $"{missing} is missing: install Debian's chromium and chromium-driver (apt-get install chromium chromium-driver) to run the browser test";
        }
    }

    public static bool InCi => string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase);

    /// <summary>What is missing, or null.</summary>
    public static string? Missing() =>
        !File.Exists(Chromium) ? Chromium : !File.Exists(ChromeDriver) ? ChromeDriver : null;
}
