using LineTest.Core.Results;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultStoreJournalTests
{
    [Fact]
    public async Task JournalAsync_ThenAppendOfTheSameRun_LeavesNoJournalEntry()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using var store = SqliteResultStore.Open(directory);

        await store.JournalAsync([run with { Verdict = Verdict.Error, Reason = "in progress" }], CancellationToken.None);
        Assert.Single(await store.ReadJournalAsync(CancellationToken.None));
        await store.AppendAsync(run, CancellationToken.None);

        Assert.Empty(await store.ReadJournalAsync(CancellationToken.None));
    }

    [Fact]
    public async Task JournalAsync_TwiceForOneRun_KeepsOneEntryWithTheLaterReadings()
    {
        var directory = Some.TempDirectory();
        var early = new RunRecordBuilder().WithReadings().Build();
        var later = early with { Readings = new RunRecordBuilder().Build().Readings };
        await using var store = SqliteResultStore.Open(directory);

        await store.JournalAsync([early], CancellationToken.None);
        await store.JournalAsync([later], CancellationToken.None);

        var entry = Assert.Single(await store.ReadJournalAsync(CancellationToken.None));
        Assert.Equal(later.Readings.Count, entry.Readings.Count);
        Assert.NotEmpty(entry.Readings);
    }

    [Fact]
    public async Task RecoverInterruptedAsync_AfterReopen_StoresEachEntryAsInterruptedErrorWithItsReadings()
    {
        var directory = Some.TempDirectory();
        var finished = new RunRecordBuilder().Build();
        var cut = new RunRecordBuilder().Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(finished, CancellationToken.None);
            await store.JournalAsync([cut with { Verdict = Verdict.Error, Reason = "in progress: measure" }], CancellationToken.None);
        }

        IReadOnlyList<RunRecord> recovered;
        await using (var store = SqliteResultStore.Open(directory))
        {
            recovered = await store.RecoverInterruptedAsync(CancellationToken.None);
            Assert.Empty(await store.RecoverInterruptedAsync(CancellationToken.None));
        }

        var run = Assert.Single(recovered);
        Assert.Equal(cut.Id, run.Id);
        Assert.Equal(Verdict.Error, run.Verdict);
        Assert.Equal("interrupted", run.Reason);
        var stored = await SqliteResultReader.InDirectory(directory).LoadRunAsync(cut.Id);
        Assert.NotNull(stored);
        Assert.Equal(cut.Readings.Count, stored.Readings.Count);
        var chain = await ChainVerifier.VerifyAsync(ResultsDatabase.PathIn(directory));
        Assert.True(chain.IsIntact, chain.FirstProblem?.Message);
        Assert.Equal(2, chain.RunsChecked);
    }

    [Fact]
    public async Task Open_SchemaVersionOneFile_MigratesToCurrentKeepingItsRuns()
    {
        var directory = Some.TempDirectory();
        var run = new RunRecordBuilder().Build();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(run, CancellationToken.None);
        }

        // Turn the file back into what version 1 wrote: no journal, no release list, user_version 1.
        var path = ResultsDatabase.PathIn(directory);
        using (var connection = new SqliteConnection($"Data Source={path};Pooling=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = "DROP TABLE runs_in_progress; DROP TABLE releases; DROP TABLE release_revocations; PRAGMA user_version = 1;";
            command.ExecuteNonQuery();
        }

        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.JournalAsync([new RunRecordBuilder().Build()], CancellationToken.None);
            Assert.Empty(await store.ReadReleasesAsync(CancellationToken.None));
        }

        using var check = new SqliteConnection($"Data Source={path};Mode=ReadOnly;Pooling=False");
        check.Open();
        Assert.Equal(3L, RawDb.Scalar(check, "PRAGMA user_version;"));
        Assert.Equal(1L, RawDb.Scalar(check, "SELECT count(*) FROM runs;"));
        Assert.Equal(1L, RawDb.Scalar(check, "SELECT count(*) FROM runs_in_progress;"));
        Assert.True((await ChainVerifier.VerifyAsync(path)).IsIntact);
    }
}
