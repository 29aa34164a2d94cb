namespace LineTest.TestSupport.Filters;

/// <summary>
/// One report filter as plain values (null: the condition is not set), turned into a storage <c>RunFilter</c> or a
/// report query by the test that uses it. <see cref="ToUtc"/> is exclusive, as in the filters.
/// </summary>
public sealed record FilterCase(
    DateTimeOffset? FromUtc,
    DateTimeOffset? ToUtc,
    string? Station,
    int? Slot,
    string? Lot,
    string? SequenceId,
    int? SequenceRevision,
    string? Serial)
{
    /// <summary>True when <paramref name="run"/> meets every set condition: the expected answer, written out once more.</summary>
    public bool Expects(Core.Results.RunRecord run)
    {
        ArgumentNullException.ThrowIfNull(run);
        return (FromUtc is null || run.EndedUtc >= FromUtc)
            && (ToUtc is null || run.EndedUtc < ToUtc)
            && (Station is null || run.Station == Station)
            && (Slot is null || run.Slot == Slot)
            && (Lot is null || run.Lot == Lot)
            && (SequenceId is null || run.SequenceId == SequenceId)
            && (SequenceRevision is null || run.SequenceRevision == SequenceRevision)
            && (Serial is null || run.Serial == Serial);
    }
}
