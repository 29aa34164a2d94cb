using LineTest.Core.Results;
using LineTest.Storage.Json;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The journal of runs in progress (<c>runs_in_progress</c>): what each unit under test has measured so far, so that
/// after a crash or a power cut the station can store those runs as interrupted instead of losing them.
/// </summary>
public sealed partial class SqliteResultStore
{
    /// <summary>The reason stored with a run that was in progress when the station stopped.</summary>
    public const string InterruptedReason = "interrupted";

    /// <summary>
    /// Writes (or replaces) the journal entries of <paramref name="inProgress"/> in one transaction, flushed before
    /// this returns. Each entry's <see cref="RunRecord.EndedUtc"/> is the time of the snapshot.
    /// </summary>
    /// <exception cref="ResultStoreException">The journal could not be written; the message says why.</exception>
    public async Task JournalAsync(IReadOnlyList<RunRecord> inProgress, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(inProgress);
        if (inProgress.Count == 0)
        {
            return;
        }

        foreach (var run in inProgress)
        {
            CheckRequired(run);
        }

        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            InWrite(transaction =>
            {
                WriteJournal(transaction, inProgress);
                return 0;
            });
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException)
        {
            throw SqliteFailures.Map(ex, $"The progress of {inProgress.Count} unit(s) under test was not saved", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    /// <summary>The journal entries left by runs that never ended, oldest first.</summary>
    public async Task<IReadOnlyList<RunRecord>> ReadJournalAsync(CancellationToken ct)
    {
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            return ReadJournal(null);
        }
        catch (Exception ex) when (ex is SqliteException or IOException)
        {
            throw SqliteFailures.Map(ex, "The journal of runs in progress cannot be read", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    private void WriteJournal(SqliteTransaction transaction, IReadOnlyList<RunRecord> inProgress)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;

        // A run already stored never comes back into the journal: its entry would be stored a second time at the next start.
        command.CommandText = """
            INSERT INTO runs_in_progress (id, serial, slot, batch_id, started_utc, updated_utc, record_json)
            SELECT $id, $serial, $slot, $batch, $started, $updated, $json
            WHERE NOT EXISTS (SELECT 1 FROM runs WHERE id = $id)
            ON CONFLICT (id) DO UPDATE SET updated_utc = excluded.updated_utc, record_json = excluded.record_json;
            """;
        var id = command.Parameters.Add("$id", SqliteType.Text);
        var serial = command.Parameters.Add("$serial", SqliteType.Text);
        var slot = command.Parameters.Add("$slot", SqliteType.Integer);
        var batch = command.Parameters.Add("$batch", SqliteType.Text);
        var started = command.Parameters.Add("$started", SqliteType.Text);
        var updated = command.Parameters.Add("$updated", SqliteType.Text);
        var json = command.Parameters.Add("$json", SqliteType.Text);
        foreach (var run in inProgress)
        {
            id.Value = run.Id.ToString("D");
            serial.Value = run.Serial;
            slot.Value = (long)run.Slot;
            batch.Value = (object?)run.BatchId ?? DBNull.Value;
            started.Value = UtcText.ToText(run.StartedUtc);
            updated.Value = UtcText.ToText(run.EndedUtc);
            json.Value = RunJson.Serialize(run);
            command.ExecuteNonQuery();
        }
    }

    private List<RunRecord> ReadJournal(SqliteTransaction? transaction)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT id, record_json FROM runs_in_progress ORDER BY started_utc, slot, id;";
        using var reader = command.ExecuteReader();
        var runs = new List<RunRecord>();
        while (reader.Read())
        {
            var id = reader.GetString(0);
            try
            {
                runs.Add(RunJson.Deserialize(reader.GetString(1)));
            }
            catch (Exception ex) when (ex is System.Text.Json.JsonException or NotSupportedException or ArgumentException)
            {
                throw new ResultStoreException(
                    ResultStoreFailure.Rejected,
                    $"The journal entry of run {id} in '{DatabasePath}' is not a run ({ex.Message}). Move the database aside and call the test engineer.",
                    ex);
            }
        }

        return runs;
    }

    private void EndJournalEntry(SqliteTransaction transaction, object runId)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "DELETE FROM runs_in_progress WHERE id = $id;";
        command.Parameters.AddWithValue("$id", runId);
        command.ExecuteNonQuery();
    }
}
