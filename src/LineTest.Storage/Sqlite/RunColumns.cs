using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The <c>runs</c> columns that repeat fields of <c>run_json</c>, and their values for a run. Written by the
/// store and compared by the chain verifier, so both sides share one definition.
/// Values are normalised to what SQLite hands back: text as string, integers as long, absent as null.
/// </summary>
internal static class RunColumns
{
    public static readonly string[] Names =
    [
        "id", "serial", "verdict", "started_utc", "ended_utc", "product", "sequence_id", "sequence_revision",
        "sequence_sha256", "station", "fixture", "slot", "lot", "operator", "batch_id", "mode", "reason",
        "first_failing_reading", "reading_count",
    ];

    public static object?[] Values(RunRecord run) =>
    [
        run.Id.ToString("D"),
        run.Serial,
        run.Verdict.ToWord(),
        UtcText.ToText(run.StartedUtc),
        UtcText.ToText(run.EndedUtc),
        run.Product,
        run.SequenceId,
        (long)run.SequenceRevision,
        run.SequenceSha256,
        run.Station,
        run.Fixture,
        (long)run.Slot,
        run.Lot,
        run.Operator,
        run.BatchId,
        run.Mode,
        run.Reason,
        run.FirstFailingReading,
        (long)run.Readings.Count,
    ];
}
