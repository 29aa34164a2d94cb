using LineTest.Storage.Proof;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Backup;

/// <summary>
/// A consistent copy of a results database while a station may be writing to it, through SQLite's online backup API
/// (<see cref="SqliteConnection.BackupDatabase(SqliteConnection)"/>), inside one read transaction: the copy holds every
/// committed run up to one moment, including the ones still in the WAL file (which a plain copy of <c>results.db</c>
/// would lose). Beside the copy, <c>FILE.head</c> records its head, so a restored copy verifies. The write lock is held only
/// while the snapshot and the head file are read (milliseconds), never while copying.
/// </summary>
public static class ResultsBackup
{
    /// <summary>Copies the database of <paramref name="resultsFolder"/> to <paramref name="toFile"/> (which must not exist).</summary>
    /// <exception cref="ResultStoreException">The source cannot be read or the copy cannot be written.</exception>
    public static Task<BackupResult> CreateAsync(string resultsFolder, string toFile, CancellationToken ct) =>
        CreateAsync(resultsFolder, toFile, ct, raceWindow: null);

    /// <summary>
    /// As <see cref="CreateAsync(string, string, CancellationToken)"/>; <paramref name="raceWindow"/> (a test seam) runs in the
    /// first attempt between taking the snapshot and reading the head, where a station's writes can fall.
    /// </summary>
    internal static async Task<BackupResult> CreateAsync(string resultsFolder, string toFile, CancellationToken ct, Func<Task>? raceWindow)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(resultsFolder);
        ArgumentException.ThrowIfNullOrWhiteSpace(toFile);
        var target = Path.GetFullPath(toFile);
        var source = ResultsDatabase.PathIn(resultsFolder);
        if (!File.Exists(source))
        {
            return new BackupResult(null, null, null, $"no results database at {source}", null);
        }

        if (File.Exists(target) || Directory.Exists(target))
        {
            return new BackupResult(null, null, null, $"{target} already exists; a backup never overwrites: choose a new file name", null);
        }

        if (string.Equals(target, source, StringComparison.Ordinal) || string.Equals(Path.GetDirectoryName(target), Path.GetFullPath(resultsFolder), StringComparison.Ordinal))
        {
            return new BackupResult(null, null, null, $"{target} is inside the results folder; keep backups elsewhere", null);
        }

        var temp = target + ".partial";
        var reader = new SqliteResultReader(source);
        try
        {
            Directory.CreateDirectory(Path.GetDirectoryName(target)!);
            File.Delete(temp);
            await using var from = await reader.OpenAsync(ct).ConfigureAwait(false);
            var (snapshot, state, head, matched) = await SnapshotAsync(from, resultsFolder, source, raceWindow).ConfigureAwait(false);
            using var keep = snapshot;
            using (var to = new SqliteConnection(ResultsDatabase.ConnectionString(temp, SqliteOpenMode.ReadWriteCreate)))
            {
                to.Open();
                from.BackupDatabase(to);
                using var command = to.CreateCommand();
                command.CommandText = "PRAGMA journal_mode = DELETE;";
                command.ExecuteNonQuery();
            }

            using (var flush = new FileStream(temp, FileMode.Open, FileAccess.ReadWrite, FileShare.None))
            {
                flush.Flush(flushToDisk: true);
            }

            File.Move(temp, target);
            var proven = state;
            var headPath = target + ".head";
            File.WriteAllText(headPath, HeadFile.Format(new ResultsHead(proven, null)));
            var warning = matched is null
                ? $"the results folder did not match its head when copied ({(head is null ? "no head file" : "run 'linetest verify' on it")}); the copy's head records what was copied"
                : null;
            return new BackupResult(target, headPath, proven, null, warning);
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, $"The backup to {target} failed", source);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new ResultStoreException(ResultStoreFailure.CannotOpen, $"The backup to {target} failed: {ex.Message}", ex);
        }
        finally
        {
            if (File.Exists(temp))
            {
                File.Delete(temp);
            }
        }
    }

    /// <summary>
    /// The copy's read snapshot, its proof state and the head file it is matched against. First without any lock: a
    /// station writes rarely, so the head read just after the snapshot almost always still holds it. When it does not
    /// (writes fell between the two reads: the head moved on twice), both are read again with writers held off for that
    /// moment, so a folder nobody edited never gets the "did not match its head" warning.
    /// </summary>
    private static async Task<(SqliteTransaction Snapshot, HeadState State, ResultsHead? Head, HeadState? Matched)> SnapshotAsync(
        SqliteConnection from, string resultsFolder, string source, Func<Task>? raceWindow)
    {
        var snapshot = from.BeginTransaction(deferred: true);
        var state = ProofReader.Read(from, snapshot, runs: null);
        if (raceWindow is not null)
        {
            await raceWindow().ConfigureAwait(false);
        }

        var head = HeadFile.Read(resultsFolder).Head;
        if (head is null || Match(head, state) is not null)
        {
            return (snapshot, state, head, head is null ? null : Match(head, state));
        }

        snapshot.Dispose();
        using (WritersHeldOff(source))
        {
            // With writers held off, no write is between replacing the head and committing (a station writes the head
            // inside its transaction), so the snapshot and the head file are read at the same moment.
            snapshot = from.BeginTransaction(deferred: true);
            state = ProofReader.Read(from, snapshot, runs: null);
            head = HeadFile.Read(resultsFolder).Head;
        }

        return (snapshot, state, head, head is null ? null : Match(head, state));
    }

    /// <summary>The head's state that <paramref name="state"/> is (its current one, or its previous one after a write that did not commit).</summary>
    private static HeadState? Match(ResultsHead head, HeadState state) =>
        head.Current.SameContent(state) ? head.Current
        : head.Previous is { } previous && previous.SameContent(state) ? previous
        : null;

    /// <summary>
    /// Holds the database's write lock (an immediate transaction on a connection of its own) for the moment the snapshot
    /// and the head are read; writers wait meanwhile, as for any other write. Where the database cannot be opened for
    /// writing (a read-only copy brought to the office), nothing is held and no one can be writing anyway.
    /// </summary>
    private static IDisposable? WritersHeldOff(string source)
    {
        var gate = new SqliteConnection(ResultsDatabase.ConnectionString(source, SqliteOpenMode.ReadWrite, TimeSpan.FromSeconds(30)));
        try
        {
            gate.Open();
            var transaction = gate.BeginTransaction(deferred: false);
            return new Gate(gate, transaction);
        }
        catch (SqliteException ex) when (ex.SqliteErrorCode is SQLitePCL.raw.SQLITE_READONLY or SQLitePCL.raw.SQLITE_CANTOPEN or SQLitePCL.raw.SQLITE_PERM)
        {
            gate.Dispose();
            return null;
        }
        catch
        {
            gate.Dispose();
            throw;
        }
    }

    private sealed class Gate(SqliteConnection connection, SqliteTransaction transaction) : IDisposable
    {
        public void Dispose()
        {
            transaction.Dispose();
            connection.Dispose();
        }
    }
}
