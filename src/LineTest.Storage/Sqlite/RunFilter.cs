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
    /// Lowest run <c>seq</c> (insertion order) to include. With <see cref="LastSeq"/> it cuts a large scan into
    /// ranges that can be read on several connections at once, and pins a report to the runs that existed when
    /// it started.
    /// </summary>
    public long? FirstSeq { get; init; }

    /// <summary>Highest run <c>seq</c> to include (inclusive).</summary>
    public long? LastSeq { get; init; }

    /// <summary>
    /// Reading names to keep when reading readings (empty or null: all). Ignored when reading run summaries.
    /// </summary>
    public IReadOnlyCollection<string>? ReadingNames { get; init; }

    /// <summary>
    /// The filter's conditions applied to one run in C#, for inputs that are not a database (a readings CSV). Exactly
    /// the conditions <c>FilterSql</c> writes as SQL, with the same comparisons: ordinal text, <see cref="FromUtc"/>
    /// inclusive, <see cref="ToUtc"/> exclusive. A condition on a value the run does not have (null) does not match.
    /// Seq bounds and reading names are not conditions on a run's fields and are ignored here.
    /// </summary>
    public bool Matches(DateTimeOffset? endedUtc, string? station, int? slot, string? lot, string? sequenceId, int? revision, string? serial) =>
        (FromUtc is not { } from || (endedUtc is { } a && a >= from))
        && (ToUtc is not { } to || (endedUtc is { } b && b < to))
        && (Station is null || string.Equals(station, Station, StringComparison.Ordinal))
        && (Slot is not { } s || slot == s)
        && (Lot is null || string.Equals(lot, Lot, StringComparison.Ordinal))
        && (SequenceId is null || string.Equals(sequenceId, SequenceId, StringComparison.Ordinal))
        && (SequenceRevision is not { } r || revision == r)
        && (Serial is null || string.Equals(serial, Serial, StringComparison.Ordinal));

    /// <summary>True when any condition on the runs is set (reading names aside).</summary>
    internal bool HasRunCondition =>
        FromUtc is not null || ToUtc is not null || Station is not null || Slot is not null || Lot is not null
        || SequenceId is not null || SequenceRevision is not null || Serial is not null || FirstSeq is not null
        || LastSeq is not null;
}
