namespace LineTest.Station.Hosting;

/// <summary>The safety note shown once when the station starts (and printed in the README).</summary>
public static class SafetyNote
{
    /// <summary>The note, line by line.</summary>
    public static IReadOnlyList<string> Lines { get; } =
    [
        "CAUTION: the block and its inserts can be hot enough to burn or cold enough to freeze skin.",
        "  Let the block reach a safe temperature before touching inserts; use tongs or gloves.",
        "  Keep liquids away from mains-powered instruments; baths can spill.",
        "  Handle open boards with ESD protection.",
        "  This software is no substitute for hardware interlocks: follow local codes and the site's safety procedures.",
    ];
}
