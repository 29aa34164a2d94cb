using System.Security.Cryptography;
using System.Text;
using LineTest.Core.Results;
using LineTest.Storage.Json;
using LineTest.Storage.Proof;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Start-up recovery of the journal of runs in progress, one entry per transaction, so it can stop at any moment and run
/// again: an entry is stored and removed together, an entry whose run is already stored is only removed, and an entry that
/// cannot be read is stored as an error run that keeps its text.
/// </summary>
public sealed partial class SqliteResultStore
{
    /// <summary>The reason stored with a journal entry that could not be read as a run; its raw text is kept in the run.</summary>
    public const string JournalUnreadableReason = "journal-unreadable";

    /// <summary>
    /// The reason stored with a journal entry that <c>results.head</c> does not prove the station wrote (added or changed
    /// outside LineTest, or left by a database rolled back to an older state). <c>linetest verify</c> reports such runs.
    /// </summary>
    public const string JournalUnprovenReason = "journal-unproven";

    /// <summary>The reading that holds the raw text of an unreadable journal entry (in its note).</summary>
    public const string JournalRawReading = "journal.raw";

    /// <summary>
    /// Stores every journal entry as a finished run with verdict <c>error</c>, reason <see cref="InterruptedReason"/>,
    /// the readings it had and its last journal time as its end. Returns the runs stored. See <see cref="RecoverAsync"/>.
    /// </summary>
    /// <exception cref="ResultStoreException">A run could not be stored; those stored before it stay stored.</exception>
    public async Task<IReadOnlyList<RunRecord>> RecoverInterruptedAsync(CancellationToken ct) =>
        (await RecoverAsync(ct).ConfigureAwait(false)).Stored;

    /// <summary>
    /// Empties the journal of runs in progress, one entry per transaction (stop at any moment, run again: nothing is stored
    /// twice or lost). An entry whose run id is already stored is removed (<see cref="JournalRecovery.Removed"/>); an entry
    /// that is not a run is stored as an error run with reason <see cref="JournalUnreadableReason"/> and its text in reading
    /// <see cref="JournalRawReading"/>; an entry the head does not prove is stored with reason <see cref="JournalUnprovenReason"/>;
    /// every other entry with reason <see cref="InterruptedReason"/>.
    /// </summary>
    /// <exception cref="ResultStoreException">An entry could not be stored; those handled before it stay handled.</exception>
    public async Task<JournalRecovery> RecoverAsync(CancellationToken ct)
    {
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        var stored = new List<RunRecord>();
        var removed = new List<RemovedJournalEntry>();
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            var rows = ReadJournalRows();
            Fault("recovery-read");
            foreach (var row in rows)
            {
                RunRecord? storedRun = null;
                RemovedJournalEntry? removedEntry = null;
                InWrite(transaction =>
                {
                    (storedRun, removedEntry) = RecoverRow(transaction, row);
                    return storedRun is null ? 0 : 1;
                });
                if (storedRun is not null)
                {
                    stored.Add(storedRun);
                }

                if (removedEntry is not null)
                {
                    removed.Add(removedEntry);
                }
            }

            return new JournalRecovery(stored, removed);
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException)
        {
            throw SqliteFailures.Map(ex, $"Recovering the runs interrupted by the last stop failed after {stored.Count} were stored", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    private (RunRecord? Stored, RemovedJournalEntry? Removed) RecoverRow(SqliteTransaction transaction, JournalRow row)
    {
        if (!StillInJournal(transaction, row))
        {
            return (null, null);
        }

        Fault("recovery-checked");
        var parsed = TryReadRun(row, out var problem);
        var id = parsed?.Id ?? UnreadableId(row);
        if (IsStored(transaction, row.Id) || IsStored(transaction, id.ToString("D")))
        {
            DeleteJournalRow(transaction, row.Id);
            Fault("recovery-removed");
            return (null, new RemovedJournalEntry(row.Id, row.Serial, row.Slot));
        }

        var run = parsed is null
            ? Unreadable(row, id, problem!)
            : parsed with { Verdict = Verdict.Error, Reason = Proven(row) ? InterruptedReason : JournalUnprovenReason };
        Insert(transaction, run, RunJson.Serialize(run));
        DeleteJournalRow(transaction, row.Id);
        return (run, null);
    }

    private bool Proven(JournalRow row)
    {
        if (OpenedHead.Head is not { } head)
        {
            // No head (a database from before the head file, or a first start): nothing to prove against.
            return true;
        }

        var proof = new JournalProof(row.Id, ProofReader.JournalHash(row.Json));
        return head.Current.Journal.Contains(proof) || (head.Previous?.Journal.Contains(proof) ?? false);
    }

    private static RunRecord? TryReadRun(JournalRow row, out string? problem)
    {
        try
        {
            var run = RunJson.Deserialize(row.Json);
            CheckRequired(run);
            if (!string.Equals(run.Id.ToString("D"), row.Id, StringComparison.OrdinalIgnoreCase))
            {
                problem = $"its text is run {run.Id:D}, but the entry is run {row.Id}";
                return null;
            }

            problem = null;
            return run;
        }
        catch (Exception ex) when (ex is System.Text.Json.JsonException or NotSupportedException or ArgumentException or InvalidOperationException)
        {
            problem = ex.Message;
            return null;
        }
    }

    private static Guid UnreadableId(JournalRow row)
    {
        if (Guid.TryParse(row.Id, out var id))
        {
            return id;
        }

        // The same entry always gets the same id, so a recovery that stops and runs again cannot store it twice.
        var hash = SHA256.HashData(Encoding.UTF8.GetBytes(row.Id + "\n" + row.Json));
        return new Guid(hash.AsSpan(0, 16));
    }

    private static RunRecord Unreadable(JournalRow row, Guid id, string problem)
    {
        const string unknown = "unknown";
        var ended = UtcText.TryParse(row.Updated) ?? UtcText.TryParse(row.Started) ?? DateTimeOffset.UnixEpoch;
        return new RunRecord
        {
            Id = id,
            Serial = row.Serial.Length == 0 ? unknown : row.Serial,
            Product = unknown,
            SequenceId = unknown,
            SequenceRevision = 0,
            SequenceSha256 = unknown,
            Station = unknown,
            Fixture = unknown,
            Slot = (int)Math.Clamp(row.Slot, int.MinValue, int.MaxValue),
            BatchId = row.BatchId,
            StartedUtc = UtcText.TryParse(row.Started) ?? ended,
            EndedUtc = ended,
            Verdict = Verdict.Error,
            Reason = JournalUnreadableReason,
            FirstFailingReading = JournalRawReading,
            Readings =
            [
                new Reading(JournalRawReading, null, "text", null, null, Verdict.Error) { Note = row.Json },
                new Reading("journal.problem", null, "text", null, null, Verdict.Error) { Note = problem },
            ],
        };
    }

    private List<JournalRow> ReadJournalRows()
    {
        using var command = _connection.CreateCommand();
        command.CommandText = "SELECT id, serial, slot, batch_id, started_utc, updated_utc, record_json FROM runs_in_progress ORDER BY started_utc, slot, id;";
        using var reader = command.ExecuteReader();
        var rows = new List<JournalRow>();
        while (reader.Read())
        {
            rows.Add(new JournalRow(
                Text(reader, 0) ?? string.Empty,
                Text(reader, 1) ?? string.Empty,
                reader.IsDBNull(2) ? 0 : reader.GetValue(2) is long slot ? slot : 0,
                Text(reader, 3),
                Text(reader, 4),
                Text(reader, 5),
                Text(reader, 6) ?? string.Empty));
        }

        return rows;

        static string? Text(SqliteDataReader reader, int ordinal) =>
            reader.IsDBNull(ordinal) ? null : Convert.ToString(reader.GetValue(ordinal), System.Globalization.CultureInfo.InvariantCulture);
    }

    private bool StillInJournal(SqliteTransaction transaction, JournalRow row)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT count(*) FROM runs_in_progress WHERE id = $id AND record_json = $json;";
        command.Parameters.AddWithValue("$id", row.Id);
        command.Parameters.AddWithValue("$json", row.Json);
        return (long)command.ExecuteScalar()! > 0;
    }

    private bool IsStored(SqliteTransaction transaction, string id)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT count(*) FROM runs WHERE id = $id;";
        command.Parameters.AddWithValue("$id", id);
        return (long)command.ExecuteScalar()! > 0;
    }

    private void DeleteJournalRow(SqliteTransaction transaction, string id) => EndJournalEntry(transaction, id);

    /// <summary>One journal row as stored, read without trusting its text.</summary>
    private sealed record JournalRow(string Id, string Serial, long Slot, string? BatchId, string? Started, string? Updated, string Json);
}
