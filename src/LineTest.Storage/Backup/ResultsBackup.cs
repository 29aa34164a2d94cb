using LineTest.Storage.Proof;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Backup;

/// <summary>
/// A consistent copy of a results database while a station may be writing to it, through SQLite's online backup API
/// (<see cref="SqliteConnection.BackupDatabase(SqliteConnection)"/>), inside one read transaction: the copy holds every
/// committed run up to one moment, including the ones still in the WAL file (which a plain copy of <c>results.db</c>
/// would lose). Beside the copy, <c>FILE.head</c> records its head, so a restored copy verifies. Takes no writer lock.
/// </summary>
public static class ResultsBackup
{
    /// <summary>Copies the database of <paramref name="resultsFolder"/> to <paramref name="toFile"/> (which must not exist).</summary>
    /// <exception cref="ResultStoreException">The source cannot be read or the copy cannot be written.</exception>
    public static async Task<BackupResult> CreateAsync(string resultsFolder, string toFile, CancellationToken ct)
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
            using var snapshot = from.BeginTransaction(deferred: true);
            var state = ProofReader.Read(from, snapshot, runs: null);
            var head = HeadFile.Read(resultsFolder).Head;
            var matched = head is null ? null
                : head.Current.SameContent(state) ? head.Current
                : head.Previous is { } previous && previous.SameContent(state) ? previous
                : null;
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
            var proven = state with { Runs = state.Runs };
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
}
