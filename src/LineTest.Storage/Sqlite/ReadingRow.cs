using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>One reading with the columns of its run that reports filter and group by.</summary>
/// <param name="RunSeq">The run's insertion order.</param>
/// <param name="RunId">The run's id.</param>
/// <param name="Serial">The unit's serial.</param>
/// <param name="RunVerdict">The run's overall verdict.</param>
/// <param name="EndedUtc">End of the run (UTC).</param>
/// <param name="Station">Station id.</param>
/// <param name="Slot">Slot number, 1-based.</param>
/// <param name="Lot">Production lot, if known.</param>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="SequenceRevision">Sequence revision.</param>
/// <param name="Ordinal">Position of the reading in its run, 0-based.</param>
/// <param name="Name">Reading name.</param>
/// <param name="Value">The value, or null when it could not be obtained (or was NaN).</param>
/// <param name="Unit">Unit symbol.</param>
/// <param name="Low">Lower tolerance limit.</param>
/// <param name="High">Upper tolerance limit.</param>
/// <param name="Verdict">The reading's verdict.</param>
/// <param name="Step">Step that produced it.</param>
/// <param name="Setpoint">Setpoint name it was taken at.</param>
/// <param name="Uncertainty">Expanded uncertainty U.</param>
/// <param name="AcceptanceLow">Lower acceptance limit used.</param>
/// <param name="AcceptanceHigh">Upper acceptance limit used.</param>
public readonly record struct ReadingRow(
    long RunSeq,
    Guid RunId,
    string Serial,
    Verdict RunVerdict,
    DateTimeOffset EndedUtc,
    string Station,
    int Slot,
    string? Lot,
    string SequenceId,
    int SequenceRevision,
    int Ordinal,
    string Name,
    double? Value,
    string Unit,
    double? Low,
    double? High,
    Verdict Verdict,
    string? Step,
    string? Setpoint,
    double? Uncertainty,
    double? AcceptanceLow,
    double? AcceptanceHigh);
