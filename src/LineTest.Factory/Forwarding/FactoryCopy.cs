using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using Npgsql;
using NpgsqlTypes;

namespace LineTest.Factory.Forwarding;

/// <summary>Writes accepted runs and their readings with binary COPY, inside the forwarder's transaction.</summary>
internal static class FactoryCopy
{
    private const string RunCopy = """
        COPY runs (ended_utc, ended_ticks, station, chain_id, station_seq, run_id, serial, verdict, started_utc, product,
                   sequence_id, sequence_revision, sequence_sha256, fixture, slot, lot, operator, batch_id, mode, reason,
                   first_failing_reading, reading_count, prev_sha256, record_sha256, run_json) FROM STDIN (FORMAT BINARY)
        """;

    private const string ReadingCopy = """
        COPY readings (ended_utc, ended_ticks, station, chain_id, station_seq, ordinal, name, value, unit, low, high,
                       verdict, step, setpoint, uncertainty, acceptance_low, acceptance_high) FROM STDIN (FORMAT BINARY)
        """;

    public static async Task RunsAsync(NpgsqlConnection connection, Guid chainId, IReadOnlyList<AcceptedRun> runs, CancellationToken ct)
    {
        await using var writer = await connection.BeginBinaryImportAsync(RunCopy, ct).ConfigureAwait(false);
        foreach (var (stored, run) in runs)
        {
            await writer.StartRowAsync(ct).ConfigureAwait(false);
            await writer.WriteAsync(run.EndedUtc.UtcDateTime, NpgsqlDbType.TimestampTz, ct).ConfigureAwait(false);
            await writer.WriteAsync(run.EndedUtc.UtcTicks, NpgsqlDbType.Bigint, ct).ConfigureAwait(false);
            await Text(writer, run.Station, ct).ConfigureAwait(false);
            await writer.WriteAsync(chainId, NpgsqlDbType.Uuid, ct).ConfigureAwait(false);
            await writer.WriteAsync(stored.Seq, NpgsqlDbType.Bigint, ct).ConfigureAwait(false);
            await writer.WriteAsync(run.Id, NpgsqlDbType.Uuid, ct).ConfigureAwait(false);
            await Text(writer, run.Serial, ct).ConfigureAwait(false);
            await Text(writer, run.Verdict.ToWord(), ct).ConfigureAwait(false);
            await Text(writer, UtcText.ToText(run.StartedUtc), ct).ConfigureAwait(false);
            await Text(writer, run.Product, ct).ConfigureAwait(false);
            await Text(writer, run.SequenceId, ct).ConfigureAwait(false);
            await writer.WriteAsync(run.SequenceRevision, NpgsqlDbType.Integer, ct).ConfigureAwait(false);
            await Text(writer, run.SequenceSha256, ct).ConfigureAwait(false);
            await Text(writer, run.Fixture, ct).ConfigureAwait(false);
            await writer.WriteAsync(run.Slot, NpgsqlDbType.Integer, ct).ConfigureAwait(false);
            await Text(writer, run.Lot, ct).ConfigureAwait(false);
            await Text(writer, run.Operator, ct).ConfigureAwait(false);
            await Text(writer, run.BatchId, ct).ConfigureAwait(false);
            await Text(writer, run.Mode, ct).ConfigureAwait(false);
            await Text(writer, run.Reason, ct).ConfigureAwait(false);
            await Text(writer, run.FirstFailingReading, ct).ConfigureAwait(false);
            await writer.WriteAsync(run.Readings.Count, NpgsqlDbType.Integer, ct).ConfigureAwait(false);
            await Text(writer, stored.PrevSha256, ct).ConfigureAwait(false);
            await Text(writer, stored.RecordSha256, ct).ConfigureAwait(false);
            await Text(writer, stored.RunJson, ct).ConfigureAwait(false);
        }

        await writer.CompleteAsync(ct).ConfigureAwait(false);
    }

    public static async Task ReadingsAsync(NpgsqlConnection connection, Guid chainId, IReadOnlyList<AcceptedRun> runs, CancellationToken ct)
    {
        await using var writer = await connection.BeginBinaryImportAsync(ReadingCopy, ct).ConfigureAwait(false);
        foreach (var (stored, run) in runs)
        {
            for (var ordinal = 0; ordinal < run.Readings.Count; ordinal++)
            {
                var reading = run.Readings[ordinal];
                await writer.StartRowAsync(ct).ConfigureAwait(false);
                await writer.WriteAsync(run.EndedUtc.UtcDateTime, NpgsqlDbType.TimestampTz, ct).ConfigureAwait(false);
                await writer.WriteAsync(run.EndedUtc.UtcTicks, NpgsqlDbType.Bigint, ct).ConfigureAwait(false);
                await Text(writer, run.Station, ct).ConfigureAwait(false);
                await writer.WriteAsync(chainId, NpgsqlDbType.Uuid, ct).ConfigureAwait(false);
                await writer.WriteAsync(stored.Seq, NpgsqlDbType.Bigint, ct).ConfigureAwait(false);
                await writer.WriteAsync(ordinal, NpgsqlDbType.Integer, ct).ConfigureAwait(false);
                await Text(writer, reading.Name, ct).ConfigureAwait(false);
                await Real(writer, reading.Value, ct).ConfigureAwait(false);
                await Text(writer, reading.Unit, ct).ConfigureAwait(false);
                await Real(writer, reading.Low, ct).ConfigureAwait(false);
                await Real(writer, reading.High, ct).ConfigureAwait(false);
                await Text(writer, reading.Verdict.ToWord(), ct).ConfigureAwait(false);
                await Text(writer, reading.Step, ct).ConfigureAwait(false);
                await Text(writer, reading.Setpoint, ct).ConfigureAwait(false);
                await Real(writer, reading.ExpandedUncertainty, ct).ConfigureAwait(false);
                await Real(writer, reading.AcceptanceLow, ct).ConfigureAwait(false);
                await Real(writer, reading.AcceptanceHigh, ct).ConfigureAwait(false);
            }
        }

        await writer.CompleteAsync(ct).ConfigureAwait(false);
    }

    /// <summary>A reading value as the factory stores it: non-finite values as NULL (reports count them as missing either way).</summary>
    public static double? Stored(double? value) => value is double d && double.IsFinite(d) ? d : null;

    private static Task Text(NpgsqlBinaryImporter writer, string? text, CancellationToken ct) =>
        text is null ? writer.WriteNullAsync(ct) : writer.WriteAsync(text, NpgsqlDbType.Text, ct);

    private static Task Real(NpgsqlBinaryImporter writer, double? value, CancellationToken ct) =>
        Stored(value) is double d ? writer.WriteAsync(d, NpgsqlDbType.Double, ct) : writer.WriteNullAsync(ct);
}
