using LineTest.Core.Results;

namespace LineTest.Factory.Reporting;

/// <summary>One run as read for a report, held until the months before it are appended (strings shared within a read).</summary>
internal readonly record struct RunRow(
    long EndedTicks,
    Guid Chain,
    long Seq,
    string Station,
    int Slot,
    string? Lot,
    string SequenceId,
    int Revision,
    string? Product,
    string? Operator,
    string? Serial,
    Verdict Verdict,
    string? Failure,
    string? Reason,
    bool FirstRun);
