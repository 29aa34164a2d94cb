using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>One run as reports see it: the columns reports group and filter by, without its readings.</summary>
/// <param name="Seq">Insertion order in the database.</param>
/// <param name="Id">Run id.</param>
/// <param name="Serial">The unit's serial.</param>
/// <param name="Verdict">Overall verdict.</param>
/// <param name="EndedUtc">End of the run (UTC).</param>
/// <param name="Station">Station id.</param>
/// <param name="Slot">Slot number, 1-based.</param>
/// <param name="Lot">Production lot, if known.</param>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="SequenceRevision">Sequence revision.</param>
/// <param name="Reason">Plain reason for a fail or error.</param>
/// <param name="FirstFailingReading">Name of the first failing reading, if any.</param>
public readonly record struct RunSummary(
    long Seq,
    Guid Id,
    string Serial,
    Verdict Verdict,
    DateTimeOffset EndedUtc,
    string Station,
    int Slot,
    string? Lot,
    string SequenceId,
    int SequenceRevision,
    string? Reason,
    string? FirstFailingReading);
