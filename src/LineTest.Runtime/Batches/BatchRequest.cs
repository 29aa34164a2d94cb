using LineTest.Core.Sequences;

namespace LineTest.Runtime.Batches;

/// <summary>Everything a batch needs besides the instruments: what to run, on which units, and for whom.</summary>
public sealed record BatchRequest
{
    /// <summary>The checked sequence.</summary>
    public required SequenceDefinition Sequence { get; init; }

    /// <summary>SHA-256 of the sequence file's bytes.</summary>
    public required string SequenceSha256 { get; init; }

    /// <summary>Station id.</summary>
    public required string Station { get; init; }

    /// <summary>The units, one per slot.</summary>
    public required IReadOnlyList<SlotLoad> Loads { get; init; }

    /// <summary>Operator, if known.</summary>
    public string? Operator { get; init; }

    /// <summary>Production lot, if known.</summary>
    public string? Lot { get; init; }

    /// <summary>engineering or production.</summary>
    public string Mode { get; init; } = "engineering";

    /// <summary>How the batch waits at its setpoints (default <see cref="BatchSchedule.Fast"/>).</summary>
    public BatchSchedule Schedule { get; init; } = BatchSchedule.Fast;

    /// <summary>Batch id; a new one is made when absent.</summary>
    public string? BatchId { get; init; }
}
