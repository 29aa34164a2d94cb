namespace LineTest.Storage.Sqlite;

/// <summary>
/// Which runs (and readings) a report wants. Every condition set here is applied in SQL; unset conditions
/// match everything. Conditions combine with AND.
/// </summary>
public sealed record RunFilter
{
    /// <summary>Matches every run.</summary>
    public static RunFilter All { get; } = new();

    /// <summary>Runs that ended at or after this instant.</summary>
    public DateTimeOffset? FromUtc { get; init; }

    /// <summary>Runs that ended before this instant (exclusive, so consecutive days do not overlap).</summary>
    public DateTimeOffset? ToUtc { get; init; }

    /// <summary>Station id.</summary>
    public string? Station { get; init; }

    /// <summary>Slot number, 1-based.</summary>
    public int? Slot { get; init; }

    /// <summary>Production lot.</summary>
    public string? Lot { get; init; }

    /// <summary>Sequence id.</summary>
    public string? SequenceId { get; init; }

    /// <summary>Sequence revision.</summary>
    public int? SequenceRevision { get; init; }

    /// <summary>The unit's serial.</summary>
    public string? Serial { get; init; }

    /// <summary>
    /// Reading names to keep when reading readings (empty or null: all). Ignored when reading run summaries.
    /// </summary>
    public IReadOnlyCollection<string>? ReadingNames { get; init; }
}
