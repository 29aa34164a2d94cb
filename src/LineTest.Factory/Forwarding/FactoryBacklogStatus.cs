namespace LineTest.Factory.Forwarding;

/// <summary>The forwarding backlog of one station.</summary>
/// <param name="Count">Runs stored but not yet committed by the factory.</param>
/// <param name="OldestEndedUtc">End of the oldest waiting run, or null when none waits.</param>
/// <param name="LastForwardedUtc">When a batch was last committed, or null.</param>
/// <param name="Problem">Why forwarding is failing now (the server's words), or null when it is not.</param>
/// <param name="FailedAttempts">Attempts failed in a row (0 when the last one worked).</param>
public sealed record FactoryBacklogStatus(long Count, DateTimeOffset? OldestEndedUtc, DateTimeOffset? LastForwardedUtc, string? Problem, int FailedAttempts)
{
    /// <summary>Before the first pass.</summary>
    public static FactoryBacklogStatus Unknown { get; } = new(0, null, null, null, 0);

    /// <summary>One line for the screen, e.g. "factory: 12 runs waiting since 06:41 UTC (server unreachable)".</summary>
    public string Describe()
    {
        if (Count == 0 && Problem is null)
        {
            return "factory: up to date";
        }

        var since = OldestEndedUtc is { } oldest
            ? " since " + oldest.UtcDateTime.ToString("yyyy-MM-dd HH:mm", System.Globalization.CultureInfo.InvariantCulture) + " UTC"
            : string.Empty;
        var problem = Problem is null ? string.Empty : $" ({Problem}; attempt {FailedAttempts})";
        return $"factory: {Count} run(s) waiting{since}{problem}";
    }
}
