namespace LineTest.Factory.Forwarding;

/// <summary>
/// Settings of the station's forwarder (<c>Station:Factory</c> in appsettings.json). Forwarding is off when
/// <see cref="ConnectionString"/> is empty.
/// </summary>
public sealed class FactoryForwardingOptions
{
    /// <summary>The configuration section.</summary>
    public const string Section = "Station:Factory";

    /// <summary>Npgsql connection string of the factory database (e.g. <c>Host=db1;Username=station;Database=linetest</c>). Default: empty, forwarding off.</summary>
    public string? ConnectionString { get; set; }

    /// <summary>How often a station with nothing to forward looks again. Default 5 s.</summary>
    public TimeSpan PollInterval { get; set; } = TimeSpan.FromSeconds(5);

    /// <summary>First wait after a failed attempt; it doubles (with jitter) up to <see cref="MaxRetryDelay"/>. Default 1 s.</summary>
    public TimeSpan RetryDelay { get; set; } = TimeSpan.FromSeconds(1);

    /// <summary>Longest wait between attempts while the server is down. Default 60 s.</summary>
    public TimeSpan MaxRetryDelay { get; set; } = TimeSpan.FromSeconds(60);

    /// <summary>Runs per server transaction. Default 250.</summary>
    public int BatchSize { get; set; } = 250;

    /// <summary>Every problem with these settings, in one list (empty when usable).</summary>
    public IReadOnlyList<string> Validate()
    {
        var problems = new List<string>();
        if (PollInterval <= TimeSpan.Zero)
        {
            problems.Add($"{Section}:PollInterval must be positive, not {PollInterval}");
        }

        if (RetryDelay <= TimeSpan.Zero)
        {
            problems.Add($"{Section}:RetryDelay must be positive, not {RetryDelay}");
        }

        if (MaxRetryDelay < RetryDelay)
        {
            problems.Add($"{Section}:MaxRetryDelay ({MaxRetryDelay}) must be at least RetryDelay ({RetryDelay})");
        }

        if (BatchSize < 1)
        {
            problems.Add($"{Section}:BatchSize must be 1 or more, not {BatchSize}");
        }

        return problems;
    }
}
