namespace LineTest.Core.Results;

/// <summary>
/// One attempt to test one unit. Stored whole (as JSON) the moment it ends; a retest is a new run.
/// </summary>
public sealed record RunRecord
{
    /// <summary>Unique id of the run.</summary>
    public required Guid Id { get; init; }

    /// <summary>The unit's serial.</summary>
    public required string Serial { get; init; }

    /// <summary>Product name from the sequence, e.g. CTP-40A.</summary>
    public required string Product { get; init; }

    /// <summary>Sequence id.</summary>
    public required string SequenceId { get; init; }

    /// <summary>Sequence revision.</summary>
    public required int SequenceRevision { get; init; }

    /// <summary>SHA-256 (lower-case hex) of the sequence file's bytes.</summary>
    public required string SequenceSha256 { get; init; }

    /// <summary>Station id from appsettings.json.</summary>
    public required string Station { get; init; }

    /// <summary>Fixture id.</summary>
    public required string Fixture { get; init; }

    /// <summary>Slot number, 1-based.</summary>
    public required int Slot { get; init; }

    /// <summary>Operator name or badge, if known.</summary>
    public string? Operator { get; init; }

    /// <summary>Production lot, if known.</summary>
    public string? Lot { get; init; }

    /// <summary>The batch (fixture load) this run belonged to.</summary>
    public string? BatchId { get; init; }

    /// <summary>engineering or production.</summary>
    public string Mode { get; init; } = "engineering";

    /// <summary>Start (UTC).</summary>
    public required DateTimeOffset StartedUtc { get; init; }

    /// <summary>End (UTC).</summary>
    public required DateTimeOffset EndedUtc { get; init; }

    /// <summary>Overall verdict.</summary>
    public required Verdict Verdict { get; init; }

    /// <summary>Plain-language reason for a fail or error; null on pass.</summary>
    public string? Reason { get; init; }

    /// <summary>Name of the first reading that failed, if any.</summary>
    public string? FirstFailingReading { get; init; }

    /// <summary>Every reading, in the order taken.</summary>
    public IReadOnlyList<Reading> Readings { get; init; } = [];

    /// <summary>The trim, if one was computed.</summary>
    public TrimRecord? Trim { get; init; }

    /// <summary>The setpoint history.</summary>
    public IReadOnlyList<SetpointRecord> Setpoints { get; init; } = [];

    /// <summary>Firmware version reported by the unit, if identified.</summary>
    public string? Firmware { get; init; }

    /// <summary>Where the unit goes after this run, as the sequence names it (null when it names none).</summary>
    public string? Disposition { get; init; }
}
