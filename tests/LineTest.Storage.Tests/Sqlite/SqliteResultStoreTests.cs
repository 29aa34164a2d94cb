using LineTest.Core.Results;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

// The read-only tests use Unix permission bits: the station runs on Linux.
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
public sealed class SqliteResultStoreTests
{
    [Fact]
    public async Task AppendAsync_ThenReopen_RunReadsBackWithEveryFieldEqual()
    {
        var directory = Some.TempDirectory();
        var original = new RunRecordBuilder().Failing("verify.error", "verify.error 0.35 degC is above 0.25, \"check\" setpoint").Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(original, CancellationToken.None);
        }

        var loaded = await SqliteResultReader.InDirectory(directory).LoadRunAsync(original.Id);

        Assert.NotNull(loaded);
        RunAssert.Equal(original, loaded);
    }

    [Fact]
    public async Task Open_SecondStoreOnSameFolder_AppendsAfterTheFirstStoresRuns()
    {
        var directory = Some.TempDirectory();
        var first = new RunRecordBuilder().Build();
        var second = new RunRecordBuilder().Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(first, CancellationToken.None);
        }

        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(second, CancellationToken.None);
        }

        var ids = await ReadIds(directory);
        Assert.Equal([first.Id, second.Id], ids);
        var chain = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));
        Assert.True(chain.IsIntact, chain.FirstProblem?.Message);
        Assert.Equal(2, chain.RunsChecked);
    }

    [Fact]
    public async Task AppendAsync_StoreNeverDisposed_FreshConnectionReadsEveryFinishedRun()
    {
        var directory = Some.TempDirectory();
        var store = SqliteResultStore.Open(directory);
        var runs = Enumerable.Range(1, 5).Select(slot => new RunRecordBuilder().WithSlot(slot).Build()).ToList();
        foreach (var run in runs)
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        // The store stays open (as in a crash the process never closes it); a new reader must see every run.
        var ids = await ReadIds(directory);
        Assert.Equal(runs.Select(r => r.Id), ids);
        GC.KeepAlive(store);
    }

    [Fact]
    public async Task AppendAsync_FilesCopiedWhileStoreOpen_CopyHoldsEveryFinishedRun()
    {
        // What a power cut leaves on disk: the database and its write-ahead log as they are, no shared-memory
        // index and no checkpoint. SQLite rebuilds the index from the log when the copy is opened.
        var directory = Some.TempDirectory();
        var store = SqliteResultStore.Open(directory);
        var runs = Enumerable.Range(1, 4).Select(slot => new RunRecordBuilder().WithSlot(slot).Build()).ToList();
        foreach (var run in runs)
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        var copy = Some.TempDirectory();
        var source = ResultsDatabase.PathIn(directory);
        File.Copy(source, ResultsDatabase.PathIn(copy));
        Assert.True(File.Exists(source + "-wal"), "a committed run must be in the write-ahead log until a checkpoint");
        File.Copy(source + "-wal", ResultsDatabase.PathIn(copy) + "-wal");

        await using (var reopened = SqliteResultStore.Open(copy))
        {
            await reopened.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        var ids = await ReadIds(copy);
        Assert.Equal(runs.Select(r => r.Id), ids.Take(4));
        Assert.Equal(5, ids.Count);
        Assert.True((await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(copy))).IsIntact);
        await store.DisposeAsync();
    }

    [Fact]
    public async Task AppendAsync_ReadingsTable_HasOneRowPerReadingWithTheReadingsFields()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        await using var connection = RawDb.Open(directory);
        await using var command = connection.CreateCommand();
        command.CommandText = """
            SELECT run_id, ordinal, name, value, unit, low, high, verdict, step, setpoint, uncertainty,
                   standard_uncertainty, coverage_factor, decision_rule, acceptance_low, acceptance_high, samples, note, at_utc
            FROM readings ORDER BY ordinal
            """;
        await using var reader = await command.ExecuteReaderAsync();
        var index = 0;
        while (await reader.ReadAsync())
        {
            var expected = run.Readings[index];
            Assert.Equal(run.Id.ToString("D"), reader.GetString(0));
            Assert.Equal(index, reader.GetInt32(1));
            Assert.Equal(expected.Name, reader.GetString(2));
            Assert.Equal(expected.Value, Real(reader, 3));
            Assert.Equal(expected.Unit, reader.GetString(4));
            Assert.Equal(expected.Low, Real(reader, 5));
            Assert.Equal(expected.High, Real(reader, 6));
            Assert.Equal(expected.Verdict.ToWord(), reader.GetString(7));
            Assert.Equal(expected.Step, Text(reader, 8));
            Assert.Equal(expected.Setpoint, Text(reader, 9));
            Assert.Equal(expected.ExpandedUncertainty, Real(reader, 10));
            Assert.Equal(expected.StandardUncertainty, Real(reader, 11));
            Assert.Equal(expected.CoverageFactor, Real(reader, 12));
            Assert.Equal(expected.DecisionRule, Text(reader, 13));
            Assert.Equal(expected.AcceptanceLow, Real(reader, 14));
            Assert.Equal(expected.AcceptanceHigh, Real(reader, 15));
            Assert.Equal(expected.Samples, reader.IsDBNull(16) ? null : reader.GetInt32(16));
            Assert.Equal(expected.Note, Text(reader, 17));
            Assert.Equal(expected.At is { } at ? UtcText.ToText(at) : null, Text(reader, 18));
            index++;
        }

        Assert.Equal(run.Readings.Count, index);
    }

    [Fact]
    public async Task AppendAsync_RunsRow_HoldsTheRunsColumnsAndChainsFromGenesis()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().WithLot("L-7").WithSlot(3).StartedAt(new DateTimeOffset(2025, 6, 1, 10, 0, 0, TimeSpan.FromHours(2))).Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        await using var connection = RawDb.Open(directory);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT id, serial, verdict, started_utc, ended_utc, sequence_id, sequence_revision, sequence_sha256, station, slot, lot, seq, prev_sha256, record_sha256, run_json FROM runs";
        await using var reader = await command.ExecuteReaderAsync();
        Assert.True(await reader.ReadAsync());
        Assert.Equal(run.Id.ToString("D"), reader.GetString(0));
        Assert.Equal(run.Serial, reader.GetString(1));
        Assert.Equal("pass", reader.GetString(2));
        // 10:00 at UTC+2 is 08:00 UTC.
        Assert.Equal("2025-06-01T08:00:00.0000000Z", reader.GetString(3));
        Assert.Equal(UtcText.ToText(run.EndedUtc), reader.GetString(4));
        Assert.Equal(run.SequenceId, reader.GetString(5));
        Assert.Equal(run.SequenceRevision, reader.GetInt32(6));
        Assert.Equal(run.SequenceSha256, reader.GetString(7));
        Assert.Equal(run.Station, reader.GetString(8));
        Assert.Equal(3, reader.GetInt32(9));
        Assert.Equal("L-7", reader.GetString(10));
        Assert.Equal(1, reader.GetInt64(11));
        Assert.Equal(RecordHash.Genesis, reader.GetString(12));
        Assert.Equal(RecordHash.Compute(reader.GetString(14), RecordHash.Genesis), reader.GetString(13));
    }

    [Fact]
    public async Task Open_NewDatabase_UsesWalFullSyncAndRecordsSchemaVersion()
    {
        var directory = Path.Combine(Some.TempDirectory(), "not", "yet", "there");
        await using var store = SqliteResultStore.Open(directory);
        await using var connection = RawDb.Open(directory);

        Assert.Equal("wal", RawDb.Scalar(connection, "PRAGMA journal_mode;"));
        Assert.Equal(3L, RawDb.Scalar(connection, "PRAGMA user_version;"));
        Assert.Equal(0x4C545231L, RawDb.Scalar(connection, "PRAGMA application_id;"));
        Assert.Equal(ResultsDatabase.PathIn(directory), store.DatabasePath);
    }

    [Fact]
    public async Task AppendAsync_ManyThreadsAtOnce_StoresEveryRunInOneUnbrokenChain()
    {
        var directory = Some.TempDirectory();
        var runs = Enumerable.Range(0, 40).Select(i => new RunRecordBuilder().WithSlot(1 + (i % 4)).Build()).ToList();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await Parallel.ForEachAsync(runs, new ParallelOptions { MaxDegreeOfParallelism = 8 }, async (run, ct) => await store.AppendAsync(run, ct));
        }

        var ids = await ReadIds(directory);
        Assert.Equal(runs.Select(r => r.Id).Order(), ids.Order());
        var chain = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));
        Assert.True(chain.IsIntact, chain.FirstProblem?.Message);
        Assert.Equal(40, chain.RunsChecked);
    }

    [Fact]
    public async Task AppendAsync_SameRunTwice_ThrowsRejectedAndKeepsTheFirst()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using var store = SqliteResultStore.Open(directory);
        await store.AppendAsync(run, CancellationToken.None);

        var ex = await Assert.ThrowsAsync<ResultStoreException>(() => store.AppendAsync(run, CancellationToken.None));

        Assert.Equal(ResultStoreFailure.Rejected, ex.Failure);
        Assert.Contains(run.Id.ToString("D"), ex.Message, StringComparison.Ordinal);
        Assert.Single(await ReadIds(directory));
        // The store stays usable for the next unit.
        await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        Assert.Equal(2, (await ReadIds(directory)).Count);
    }

    [Fact]
    public async Task AppendAsync_AfterDispose_ThrowsObjectDisposed()
    {
        var store = SqliteResultStore.Open(Some.TempDirectory());
        await store.DisposeAsync();

        await Assert.ThrowsAsync<ObjectDisposedException>(() => store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None));
    }

    [Fact]
    public async Task Open_ReadOnlyDatabaseFile_ThrowsReadOnlyWithPlainMessage()
    {
        var directory = Some.TempDirectory();
        await SqliteResultStore.Open(directory).DisposeAsync();
        var path = ResultsDatabase.PathIn(directory);
        File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.GroupRead | UnixFileMode.OtherRead);
        try
        {
            var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(directory));

            Assert.Equal(ResultStoreFailure.ReadOnly, ex.Failure);
            Assert.Contains("read-only", ex.Message, StringComparison.Ordinal);
            Assert.Contains(path, ex.Message, StringComparison.Ordinal);
        }
        finally
        {
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        }
    }

    [Fact]
    public void Open_ReadOnlyResultsFolder_ThrowsReadOnlyWithPlainMessage()
    {
        var directory = Some.TempDirectory();
        File.SetUnixFileMode(directory, UnixFileMode.UserRead | UnixFileMode.UserExecute);
        try
        {
            var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(directory));

            Assert.Equal(ResultStoreFailure.ReadOnly, ex.Failure);
            Assert.Contains("read-only", ex.Message, StringComparison.Ordinal);
        }
        finally
        {
            File.SetUnixFileMode(directory, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
        }
    }

    [Fact]
    public async Task Open_FileThatTheSystemRefusesToWrite_ThrowsReadOnly()
    {
        // Unlike the permission-bit tests above, here SQLite itself finds the file unwritable: an immutable file
        // (chattr +i) refuses writes even to root; other accounts are refused by the owner-only mode 0400.
        var directory = Some.TempDirectory();
        await SqliteResultStore.Open(directory).DisposeAsync();
        var path = ResultsDatabase.PathIn(directory);
        var immutable = Environment.UserName == "root" && RunTool("chattr", "+i", path);
        if (!immutable)
        {
            File.SetUnixFileMode(path, UnixFileMode.UserRead);
        }

        try
        {
            var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(directory));
            Assert.Equal(ResultStoreFailure.ReadOnly, ex.Failure);
            Assert.Contains("read-only", ex.Message, StringComparison.Ordinal);
        }
        finally
        {
            if (immutable)
            {
                RunTool("chattr", "-i", path);
            }

            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        }
    }

    [Fact]
    public void Open_ResultsFolderIsAFile_ThrowsCannotOpen()
    {
        var file = Path.Combine(Some.TempDirectory(), "results");
        File.WriteAllText(file, "not a folder");

        var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(file));

        Assert.Equal(ResultStoreFailure.CannotOpen, ex.Failure);
        Assert.Contains(file, ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_DatabaseOfAnotherProgram_ThrowsIncompatibleAndLeavesItUntouched()
    {
        var directory = Some.TempDirectory();
        await using (var connection = RawDb.Open(directory, SqliteOpenMode.ReadWriteCreate))
        {
            RawDb.Scalar(connection, "CREATE TABLE invoices (id INTEGER); INSERT INTO invoices VALUES (7);");
        }

        var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(directory));

        Assert.Equal(ResultStoreFailure.Incompatible, ex.Failure);
        Assert.Contains("not a LineTest results database", ex.Message, StringComparison.Ordinal);
        await using var check = RawDb.Open(directory);
        Assert.Equal(7L, RawDb.Scalar(check, "SELECT id FROM invoices;"));
    }

    [Fact]
    public async Task Open_DatabaseFromANewerVersion_ThrowsIncompatible()
    {
        var directory = Some.TempDirectory();
        await SqliteResultStore.Open(directory).DisposeAsync();
        await using (var connection = RawDb.Open(directory, SqliteOpenMode.ReadWrite))
        {
            RawDb.Scalar(connection, "PRAGMA user_version = 99;");
        }

        var ex = Assert.Throws<ResultStoreException>(() => SqliteResultStore.Open(directory));

        Assert.Equal(ResultStoreFailure.Incompatible, ex.Failure);
        Assert.Contains("newer", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task AppendAsync_DatabaseLockedByAnotherWriter_ThrowsLocked()
    {
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory, lockTimeout: TimeSpan.FromSeconds(1));
        await using var other = RawDb.Open(directory, SqliteOpenMode.ReadWrite);
        RawDb.Scalar(other, "PRAGMA busy_timeout = 0;");
        using var transaction = other.BeginTransaction(deferred: false);
        await using (var shorten = other.CreateCommand())
        {
            shorten.Transaction = transaction;
            shorten.CommandText = "SELECT count(*) FROM runs;";
            shorten.ExecuteScalar();
        }

        var run = new RunRecordBuilder().Build();
        var ex = await Assert.ThrowsAsync<ResultStoreException>(() => store.AppendAsync(run, CancellationToken.None));

        Assert.Equal(ResultStoreFailure.Locked, ex.Failure);
        Assert.Contains("locked", ex.Message, StringComparison.Ordinal);
        transaction.Rollback();
    }

    internal static async Task<List<Guid>> ReadIds(string directory)
    {
        var ids = new List<Guid>();
        await foreach (var run in SqliteResultReader.InDirectory(directory).ReadRunsAsync())
        {
            ids.Add(run.Id);
        }

        return ids;
    }

    private static double? Real(SqliteDataReader reader, int i) => reader.IsDBNull(i) ? null : reader.GetDouble(i);

    private static string? Text(SqliteDataReader reader, int i) => reader.IsDBNull(i) ? null : reader.GetString(i);

    private static bool RunTool(string tool, params string[] arguments)
    {
        try
        {
            using var process = System.Diagnostics.Process.Start(new System.Diagnostics.ProcessStartInfo(tool, arguments)
            {
                RedirectStandardError = true,
                RedirectStandardOutput = true,
            });
            process!.WaitForExit();
            return process.ExitCode == 0;
        }
        catch (System.ComponentModel.Win32Exception)
        {
            return false;
        }
    }
}
