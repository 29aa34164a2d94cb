using LineTest.Core.Results;

namespace LineTest.Storage.History;

/// <summary>One run of a serial, as its history lists it.</summary>
/// <param name="Seq">Insertion order in the database.</param>
/// <param name="EndedUtc">End of the run (UTC).</param>
/// <param name="Station">Station id.</param>
/// <param name="Slot">Slot number, 1-based.</param>
/// <param name="Verdict">Overall verdict.</param>
/// <param name="Reason">Plain reason for a fail or error.</param>
/// <param name="FirstFailingReading">Name of the first failing reading, if any.</param>
/// <param name="Disposition">Where the unit went after the run, if the sequence named it.</param>
/// <param name="Lot">Production lot, if known.</param>
/// <param name="Operator">Operator, if known.</param>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="SequenceRevision">Sequence revision.</param>
public sealed record HistoryEntry(
    long Seq,
    DateTimeOffset EndedUtc,
    string Station,
    int Slot,
    Verdict Verdict,
    string? Reason,
    string? FirstFailingReading,
    string? Disposition,
    string? Lot,
    string? Operator,
    string SequenceId,
    int SequenceRevision);
