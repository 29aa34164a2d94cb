using System.Text.Json;
using LineTest.Factory.Schema;
using LineTest.Storage.Chain;
using LineTest.Storage.Json;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging;
using Npgsql;
using NpgsqlTypes;

namespace LineTest.Factory.Forwarding;

/// <summary>
/// Forwards a station's stored runs to the factory database in <c>seq</c> order, one transaction per batch, and
/// moves the station's watermark only after the server committed. Every run is checked at the door: a run id the
/// factory already holds with the same record hash is a duplicate (stored once); with another hash it is refused
/// and raised as an alarm, never overwritten; a record whose hash does not match its text, or that does not
/// continue its station's chain, is refused the same way. Server failures are thrown (the caller retries).
/// </summary>
/// <remarks>Thread-safe for different outboxes; one outbox is forwarded by one caller at a time.</remarks>
public sealed partial class FactoryForwarder
{
    private readonly NpgsqlDataSource _dataSource;
    private readonly TimeProvider _time;
    private readonly ILogger<FactoryForwarder> _logger;
    private readonly int _batchSize;
    private readonly SemaphoreSlim _ready = new(1, 1);

    // Months whose partitions exist; guarded by locking the set itself.
    private readonly HashSet<(int Year, int Month)> _months = [];
    private string? _factoryId;

    /// <summary>Creates a forwarder into <paramref name="dataSource"/>.</summary>
    public FactoryForwarder(NpgsqlDataSource dataSource, TimeProvider time, ILogger<FactoryForwarder> logger, int batchSize = 250)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(logger);
        ArgumentOutOfRangeException.ThrowIfLessThan(batchSize, 1);
        _dataSource = dataSource;
        _time = time;
        _logger = logger;
        _batchSize = batchSize;
    }

    /// <summary>Applies the migrations (once per forwarder) and returns the factory database's id.</summary>
    public async Task<string> EnsureReadyAsync(CancellationToken ct = default)
    {
        if (_factoryId is { } known)
        {
            return known;
        }

        await _ready.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            if (_factoryId is null)
            {
                await FactoryMigrations.ApplyAsync(_dataSource, ct).ConfigureAwait(false);
                await using var command = _dataSource.CreateCommand("SELECT id FROM factory_identity ORDER BY created_utc LIMIT 1;");
                _factoryId = ((Guid)(await command.ExecuteScalarAsync(ct).ConfigureAwait(false))!).ToString("D");
            }

            return _factoryId;
        }
        finally
        {
            _ready.Release();
        }
    }

    /// <summary>Forwards every run waiting in <paramref name="outbox"/>, batch by batch, until none waits.</summary>
    /// <exception cref="NpgsqlException">The server is unreachable or refused the work; nothing past the last committed batch was marked.</exception>
    public async Task<ForwardResult> ForwardAsync(SqliteOutbox outbox, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(outbox);
        var factoryId = await EnsureReadyAsync(ct).ConfigureAwait(false);
        var total = ForwardResult.None;
        while (true)
        {
            var pending = await outbox.ReadPendingAsync(factoryId, _batchSize, ct).ConfigureAwait(false);
            if (pending.Count == 0)
            {
                return total;
            }

            var result = await ForwardBatchAsync(Guid.ParseExact(outbox.ChainId, "N"), pending, ct).ConfigureAwait(false);

            // Only now, after the server's commit: a crash before this line forwards the batch again, which the
            // run-id check turns into duplicates.
            await outbox.MarkForwardedAsync(factoryId, result.ThroughSeq, _time.GetUtcNow(), ct).ConfigureAwait(false);
            total = total.Add(result);
            LogBatch(pending.Count, pending[0].Station, result.ThroughSeq, result.Stored, result.Duplicates, result.Refused);
        }
    }

    private async Task<ForwardResult> ForwardBatchAsync(Guid chainId, IReadOnlyList<OutboxRun> pending, CancellationToken ct)
    {
        await using var connection = await _dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await EnsureMonthsAsync(connection, pending, ct).ConfigureAwait(false);
        await using var transaction = await connection.BeginTransactionAsync(ct).ConfigureAwait(false);
        var station = pending[^1].Station;

        // The chain row is locked for the batch: two forwarders of one station database (the station's own and a
        // hand-run 'linetest forward') take turns, and the second sees the first's runs as duplicates.
        await using (var create = new NpgsqlCommand(
            "INSERT INTO chains (chain_id, station, head_seq, head_sha256, runs) VALUES (@c, @s, 0, @g, 0) ON CONFLICT (chain_id) DO NOTHING;", connection, transaction))
        {
            create.Parameters.AddWithValue("c", chainId);
            create.Parameters.AddWithValue("s", station);
            create.Parameters.AddWithValue("g", RecordHash.Genesis);
            await create.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        }

        long headSeq;
        string headHash;
        await using (var head = new NpgsqlCommand("SELECT head_seq, head_sha256 FROM chains WHERE chain_id = @c FOR UPDATE;", connection, transaction))
        {
            head.Parameters.AddWithValue("c", chainId);
            await using var reader = await head.ExecuteReaderAsync(ct).ConfigureAwait(false);
            await reader.ReadAsync(ct).ConfigureAwait(false);
            headSeq = reader.GetInt64(0);
            headHash = reader.GetString(1);
        }

        var known = await KnownAsync(connection, transaction, pending, ct).ConfigureAwait(false);
        var accepted = new List<AcceptedRun>();
        var alarms = new List<FactoryAlarm>();
        var duplicates = 0;
        foreach (var run in pending)
        {
            FactoryAlarm Alarm(string kind, string? storedHash, string detail) =>
                new(kind, run.Station, chainId, run.Seq, run.Id, storedHash, run.RecordSha256, detail);

            if (known.TryGetValue(run.Id, out var held))
            {
                if (string.Equals(held.Hash, run.RecordSha256, StringComparison.Ordinal) && held.Chain == chainId && held.Seq == run.Seq)
                {
                    duplicates++;
                }
                else
                {
                    alarms.Add(Alarm("changed-record", held.Hash, $"run {run.Id:D} arrived again with another record hash (or from another place); the stored run was kept"));
                }

                continue;
            }

            if (!string.Equals(RecordHash.Compute(run.RunJson, run.PrevSha256), run.RecordSha256, StringComparison.Ordinal))
            {
                alarms.Add(Alarm("bad-record-hash", null, $"run {run.Id:D}: its record hash does not match its stored text; it was edited after it was stored"));
                continue;
            }

            if (run.Seq <= headSeq || !string.Equals(run.PrevSha256, headHash, StringComparison.Ordinal))
            {
                alarms.Add(Alarm(
                    "chain-break",
                    null,
                    $"run {run.Id:D} (seq {run.Seq}) does not continue the station's chain held by the factory (head seq {headSeq}, {headHash[..12]}…)"));
                continue;
            }

            Core.Results.RunRecord record;
            try
            {
                record = RunJson.Deserialize(run.RunJson);
            }
            catch (JsonException ex)
            {
                alarms.Add(Alarm("unreadable-record", null, $"run {run.Id:D} is not a valid stored run: {ex.Message}"));
                continue;
            }

            accepted.Add(new AcceptedRun(run, record));
            headSeq = run.Seq;
            headHash = run.RecordSha256;
        }

        if (accepted.Count > 0)
        {
            await InsertIdsAsync(connection, transaction, chainId, accepted, ct).ConfigureAwait(false);
            await FactoryCopy.RunsAsync(connection, chainId, accepted, ct).ConfigureAwait(false);
            await FactoryCopy.ReadingsAsync(connection, chainId, accepted, ct).ConfigureAwait(false);
            await using var move = new NpgsqlCommand(
                "UPDATE chains SET head_seq = @seq, head_sha256 = @hash, runs = runs + @n, station = @s, updated_utc = now() WHERE chain_id = @c;", connection, transaction);
            move.Parameters.AddWithValue("seq", headSeq);
            move.Parameters.AddWithValue("hash", headHash);
            move.Parameters.AddWithValue("n", (long)accepted.Count);
            move.Parameters.AddWithValue("s", station);
            move.Parameters.AddWithValue("c", chainId);
            await move.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        }

        await InsertAlarmsAsync(connection, transaction, alarms, ct).ConfigureAwait(false);
        await transaction.CommitAsync(ct).ConfigureAwait(false);
        foreach (var alarm in alarms)
        {
            LogRefused(alarm.Kind, alarm.Station, alarm.StationSeq, alarm.RunId, alarm.Detail);
        }

        return new ForwardResult(accepted.Count, duplicates, alarms.Count, pending[^1].Seq);
    }

    private static async Task<Dictionary<Guid, (Guid Chain, long Seq, string Hash)>> KnownAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, IReadOnlyList<OutboxRun> pending, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(
            "SELECT run_id, chain_id, station_seq, record_sha256 FROM run_ids WHERE run_id = ANY(@ids);", connection, transaction);
        command.Parameters.AddWithValue("ids", pending.Select(r => r.Id).ToArray());
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        var known = new Dictionary<Guid, (Guid, long, string)>();
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            known[reader.GetGuid(0)] = (reader.GetGuid(1), reader.GetInt64(2), reader.GetString(3));
        }

        return known;
    }

    private static async Task InsertIdsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, Guid chainId, List<AcceptedRun> accepted, CancellationToken ct)
    {
        // ON CONFLICT on the run id: a run id that arrived meanwhile from elsewhere is not overwritten. It cannot be
        // told apart here from a real duplicate without the hash check above, so the batch is rolled back and the
        // next attempt sorts it out from run_ids.
        await using var command = new NpgsqlCommand(
            """
            INSERT INTO run_ids (run_id, chain_id, station_seq, ended_utc, record_sha256)
            SELECT id, @c, seq, ended, hash FROM unnest(@ids, @seqs, @ended, @hashes) AS t(id, seq, ended, hash)
            ON CONFLICT (run_id) DO NOTHING;
            """,
            connection,
            transaction);
        command.Parameters.AddWithValue("c", chainId);
        command.Parameters.AddWithValue("ids", accepted.Select(a => a.Run.Id).ToArray());
        command.Parameters.AddWithValue("seqs", accepted.Select(a => a.Stored.Seq).ToArray());
        command.Parameters.Add(new NpgsqlParameter("ended", NpgsqlDbType.Array | NpgsqlDbType.TimestampTz) { Value = accepted.Select(a => a.Run.EndedUtc.UtcDateTime).ToArray() });
        command.Parameters.AddWithValue("hashes", accepted.Select(a => a.Stored.RecordSha256).ToArray());
        var inserted = await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        if (inserted != accepted.Count)
        {
            throw new FactoryConflictException(
                $"{accepted.Count - inserted} run id(s) of this batch arrived meanwhile from elsewhere; the batch was rolled back and is checked again on the next attempt.");
        }
    }

    private static async Task InsertAlarmsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, List<FactoryAlarm> alarms, CancellationToken ct)
    {
        foreach (var alarm in alarms)
        {
            await using var command = new NpgsqlCommand(
                """
                INSERT INTO alarms (kind, station, chain_id, station_seq, run_id, stored_sha256, offered_sha256, detail)
                VALUES (@k, @s, @c, @q, @r, @h0, @h1, @d);
                """,
                connection,
                transaction);
            command.Parameters.AddWithValue("k", alarm.Kind);
            command.Parameters.AddWithValue("s", alarm.Station);
            command.Parameters.AddWithValue("c", alarm.ChainId);
            command.Parameters.AddWithValue("q", alarm.StationSeq);
            command.Parameters.AddWithValue("r", alarm.RunId);
            command.Parameters.AddWithValue("h0", (object?)alarm.StoredSha256 ?? DBNull.Value);
            command.Parameters.AddWithValue("h1", alarm.OfferedSha256);
            command.Parameters.AddWithValue("d", alarm.Detail);
            await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        }
    }

    private async Task EnsureMonthsAsync(NpgsqlConnection connection, IReadOnlyList<OutboxRun> pending, CancellationToken ct)
    {
        foreach (var run in pending)
        {
            var utc = run.EndedUtc.UtcDateTime;
            lock (_months)
            {
                if (_months.Contains((utc.Year, utc.Month)))
                {
                    continue;
                }
            }

            // Outside the batch's transaction: the partition exists for every forwarder once this returns.
            await using var command = new NpgsqlCommand("SELECT linetest_ensure_month(@at);", connection);
            command.Parameters.AddWithValue("at", utc);
            await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
            lock (_months)
            {
                _months.Add((utc.Year, utc.Month));
            }
        }
    }

    [LoggerMessage(EventId = 3000, Level = LogLevel.Debug, Message = "Forwarded {Count} runs of station {Station} through seq {ThroughSeq}: {Stored} stored, {Duplicates} already held, {Refused} refused")]
    private partial void LogBatch(int count, string station, long throughSeq, int stored, int duplicates, int refused);

    [LoggerMessage(EventId = 3001, Level = LogLevel.Error, Message = "ALARM {Kind}: the factory refused run seq {StationSeq} ({RunId}) of station {Station}: {Detail}")]
    private partial void LogRefused(string kind, string station, long stationSeq, Guid runId, string detail);
}
