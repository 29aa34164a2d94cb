using LineTest.Core.Results;

namespace LineTest.Runtime.Batches;

/// <summary>What a batch produced.</summary>
/// <param name="BatchId">The batch id.</param>
/// <param name="Runs">Every run of the batch, in slot order.</param>
/// <param name="Setpoints">The source's setpoint history.</param>
/// <param name="Started">When the batch started (UTC).</param>
/// <param name="Ended">When it ended (UTC).</param>
/// <param name="Aborted">Why the batch as a whole was stopped (source fault, storage failure, cancel), or null.</param>
public sealed record BatchOutcome(
    string BatchId,
    IReadOnlyList<RunRecord> Runs,
    IReadOnlyList<SetpointRecord> Setpoints,
    DateTimeOffset Started,
    DateTimeOffset Ended,
    string? Aborted);
