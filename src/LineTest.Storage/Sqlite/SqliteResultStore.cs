using LineTest.Core.Results;
using LineTest.Storage.Chain;
using LineTest.Storage.Json;
using LineTest.Storage.Locking;
using LineTest.Storage.Proof;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The embedded results store: one SQLite file, <c>results.db</c>, in the station's results folder.
/// Each run and its readings are written in one transaction that is committed (and, with
/// <c>synchronous=FULL</c>, flushed to the disk) before <see cref="AppendAsync"/> returns.
/// Every run carries the hash of the run before it (see <see cref="RecordHash"/>).
/// </summary>
/// <remarks>
/// One writer: all appends go through one connection, serialised by <see cref="_writeLock"/>. Other processes
/// may read at any time (WAL), but only the process holding the folder's writer lock (<see cref="ResultsFolderLock"/>)
/// may open a store on it. A second store in the same process also works: the chain's previous hash is read inside each
/// write transaction (<c>BEGIN IMMEDIATE</c>), so two writers can never fork the chain. Every write replaces
/// <c>results.head</c> before it commits (see <see cref="HeadFile"/>).
/// </remarks>
public sealed partial class SqliteResultStore : IResultStore
{
    // Serialises appends and disposal; the connection and commands below are only touched while holding it.
    private readonly SemaphoreSlim _writeLock = new(1, 1);
    private readonly SqliteConnection _connection;
    private readonly SqliteCommand _lastHash;
    private readonly SqliteCommand _insertRun;
    private readonly SqliteCommand _insertReading;
    private readonly ResultsFolderLock _folderLock;
    private bool _disposed;

    /// <summary>How long a write waits for another program's lock by default.</summary>
    public static readonly TimeSpan DefaultLockTimeout = TimeSpan.FromSeconds(10);

    private SqliteResultStore(string databasePath, SqliteConnection connection, ResultsFolderLock folderLock, HeadRead opened)
    {
        DatabasePath = databasePath;
        _connection = connection;
        _folderLock = folderLock;
        _folder = Path.GetDirectoryName(databasePath)!;
        OpenedHead = opened;
        _head = opened.Head;

        _lastHash = connection.CreateCommand();
        _lastHash.CommandText = "SELECT record_sha256 FROM runs ORDER BY seq DESC LIMIT 1;";

        _insertRun = CreateInsert(
            connection,
            "runs",
            [.. RunColumns.Names, "prev_sha256", "record_sha256", "run_json"],
            " RETURNING seq");
        _insertReading = CreateInsert(connection, "readings", ["run_seq", "run_id", .. ReadingColumns.Names], string.Empty);
    }

    /// <summary>The full path of the database file.</summary>
    public string DatabasePath { get; }

    /// <summary>
    /// Opens (or creates) <c>results.db</c> in <paramref name="resultsDirectory"/>, creating the folder if missing.
    /// An existing database is appended to, never overwritten.
    /// </summary>
    /// <param name="resultsDirectory">The results folder.</param>
    /// <param name="lockTimeout">How long a write waits for another program's lock before failing (default 10 s, at least 1 s).</param>
    /// <param name="clock">When the folder's writer lock is taken (default: the system clock).</param>
    /// <exception cref="ResultStoreException">The folder or file cannot be used, or another process writes to it; the message says why.</exception>
    public static SqliteResultStore Open(string resultsDirectory, TimeSpan? lockTimeout = null, TimeProvider? clock = null)
    {
        var timeout = lockTimeout ?? DefaultLockTimeout;
        ArgumentOutOfRangeException.ThrowIfLessThan(timeout, TimeSpan.FromSeconds(1), nameof(lockTimeout));
        var path = ResultsDatabase.PathIn(resultsDirectory);
        const string what = "The results database cannot be opened";
        var directory = Path.GetDirectoryName(path)!;
        try
        {
            Directory.CreateDirectory(directory);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new ResultStoreException(
                ResultStoreFailure.CannotOpen,
                $"{what}: the results folder '{directory}' cannot be created ({ex.Message}). Choose a writable folder in the station settings.",
                ex);
        }

        if (WritePermissionDenied(directory) || (File.Exists(path) && WritePermissionDenied(path)))
        {
            // Checked from the permission bits as well as by SQLite, because a privileged account would
            // otherwise write into a file that was deliberately made read-only.
            throw SqliteFailures.ReadOnly(what, path);
        }

        var attempt = ResultsFolderLock.TryAcquire(directory, clock ?? TimeProvider.System);
        if (attempt.Lock is not { } folderLock)
        {
            throw new ResultStoreException(ResultStoreFailure.InUse, attempt.Refusal!);
        }

        SqliteResultStore? opened = null;
        try
        {
            opened = OpenLocked(path, timeout, folderLock);
            return opened;
        }
        finally
        {
            if (opened is null)
            {
                folderLock.Dispose();
            }
        }
    }

    private static SqliteResultStore OpenLocked(string path, TimeSpan timeout, ResultsFolderLock folderLock)
    {
        const string what = "The results database cannot be opened";
        var connection = new SqliteConnection(ResultsDatabase.ConnectionString(path, SqliteOpenMode.ReadWriteCreate, timeout));
        try
        {
            connection.Open();
            if (SQLitePCL.raw.sqlite3_db_readonly(connection.Handle, "main") == 1)
            {
                throw SqliteFailures.ReadOnly(what, path);
            }

            // WAL: readers (reports, a sqlite3 shell) never block the writer, and a commit is one append to the
            // log. synchronous=FULL: the log is flushed at every commit, so a committed run survives a power cut.
            var journal = Scalar(connection, "PRAGMA journal_mode = WAL;") as string;
            if (!string.Equals(journal, "wal", StringComparison.OrdinalIgnoreCase))
            {
                throw new ResultStoreException(
                    ResultStoreFailure.CannotOpen,
                    $"{what}: '{path}' cannot use write-ahead logging (journal mode stayed '{journal}'). Put the results folder on a local disk.");
            }

            Scalar(connection, "PRAGMA synchronous = FULL; PRAGMA foreign_keys = ON; PRAGMA busy_timeout = 0;");
            var problem = SqliteSchema.EnsureCreated(connection);
            if (problem is not null)
            {
                throw new ResultStoreException(
                    ResultStoreFailure.Incompatible, $"{what}: '{path}' cannot be used because {problem}. Move it aside or choose another results folder.");
            }

            return new SqliteResultStore(path, connection, folderLock, HeadFile.Read(Path.GetDirectoryName(path)!));
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException or ResultStoreException)
        {
            connection.Dispose();
            throw SqliteFailures.Map(ex, what, path);
        }
    }

    /// <inheritdoc />
    /// <remarks>Completes after the commit has been flushed; the database calls themselves are synchronous.</remarks>
    public async Task AppendAsync(RunRecord run, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(run);
        CheckRequired(run);
        var json = RunJson.Serialize(run);
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            Write(run, json);
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException)
        {
            throw SqliteFailures.Map(ex, $"Run {run.Id:D} (serial {run.Serial}, slot {run.Slot}) was not saved", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    /// <inheritdoc />
    public async ValueTask DisposeAsync()
    {
        await _writeLock.WaitAsync().ConfigureAwait(false);
        try
        {
            if (_disposed)
            {
                return;
            }

            _disposed = true;
            _lastHash.Dispose();
            _insertRun.Dispose();
            _insertReading.Dispose();
            _connection.Dispose();
            _folderLock.Dispose();
        }
        finally
        {
            _writeLock.Release();
        }
    }

    private void Write(RunRecord run, string json) => InWrite(transaction =>
    {
        Insert(transaction, run, json);
        return 1;
    });

    private void Insert(SqliteTransaction transaction, RunRecord run, string json)
    {
        _lastHash.Transaction = transaction;
        var previous = _lastHash.ExecuteScalar() as string ?? RecordHash.Genesis;
        var record = RecordHash.Compute(json, previous);

        _insertRun.Transaction = transaction;
        var values = RunColumns.Values(run);
        var parameters = _insertRun.Parameters;
        for (var i = 0; i < values.Length; i++)
        {
            parameters[i].Value = values[i] ?? DBNull.Value;
        }

        parameters[values.Length].Value = previous;
        parameters[values.Length + 1].Value = record;
        parameters[values.Length + 2].Value = json;
        var seq = (long)_insertRun.ExecuteScalar()!;
        Fault("insert-run");

        _insertReading.Transaction = transaction;
        var readingParameters = _insertReading.Parameters;
        readingParameters[0].Value = seq;
        readingParameters[1].Value = values[0];
        for (var ordinal = 0; ordinal < run.Readings.Count; ordinal++)
        {
            var readingValues = ReadingColumns.Values(run.Readings[ordinal], ordinal);
            for (var i = 0; i < readingValues.Length; i++)
            {
                readingParameters[i + 2].Value = readingValues[i] ?? DBNull.Value;
            }

            _insertReading.ExecuteNonQuery();
        }

        Fault("insert-readings");

        // The run leaves the journal of runs in progress in the same transaction that stores it: after a crash it
        // is either finished (in runs) or in progress (in the journal), never both and never neither.
        EndJournalEntry(transaction, values[0]!);
        Fault("delete-journal");
    }

    private static void CheckRequired(RunRecord run)
    {
        // These are required by the model; a null here is a bug in the caller, not a storage failure.
        ArgumentNullException.ThrowIfNull(run.Serial, "run.Serial");
        ArgumentNullException.ThrowIfNull(run.Product, "run.Product");
        ArgumentNullException.ThrowIfNull(run.SequenceId, "run.SequenceId");
        ArgumentNullException.ThrowIfNull(run.SequenceSha256, "run.SequenceSha256");
        ArgumentNullException.ThrowIfNull(run.Station, "run.Station");
        ArgumentNullException.ThrowIfNull(run.Fixture, "run.Fixture");
        ArgumentNullException.ThrowIfNull(run.Mode, "run.Mode");
        ArgumentNullException.ThrowIfNull(run.Readings, "run.Readings");
        for (var i = 0; i < run.Readings.Count; i++)
        {
            var reading = run.Readings[i];
            if (reading is null || reading.Name is null || reading.Unit is null)
            {
                throw new ArgumentException($"Reading {i} of run {run.Id:D} is null or has no name or unit.", nameof(run));
            }
        }
    }

    private static bool WritePermissionDenied(string path)
    {
        if (OperatingSystem.IsWindows())
        {
            return File.Exists(path) && File.GetAttributes(path).HasFlag(FileAttributes.ReadOnly);
        }

        const UnixFileMode anyWrite = UnixFileMode.UserWrite | UnixFileMode.GroupWrite | UnixFileMode.OtherWrite;
        return (File.GetUnixFileMode(path) & anyWrite) == 0;
    }

    private static SqliteCommand CreateInsert(SqliteConnection connection, string table, string[] columns, string suffix)
    {
        var command = connection.CreateCommand();
        var names = string.Join(", ", columns);
        var placeholders = string.Join(", ", columns.Select((_, i) => $"$p{i}"));
        command.CommandText = $"INSERT INTO {table} ({names}) VALUES ({placeholders}){suffix};";
        for (var i = 0; i < columns.Length; i++)
        {
            command.Parameters.Add(new SqliteParameter($"$p{i}", DBNull.Value));
        }

        return command;
    }

    private static object? Scalar(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return command.ExecuteScalar();
    }
}
