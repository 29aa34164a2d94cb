using LineTest.Storage.Json;
using LineTest.Storage.Proof;
using LineTest.Storage.Releases;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Tests.Proof;

public sealed class ProofVerifierTests
{
    [Fact]
    public async Task VerifyAsync_RunsJournalAndReleasesWrittenByTheStore_IsIntactAtTheHead()
    {
        var folder = await StoreAsync(runs: 4);
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AddReleaseAsync(Release("a"), CancellationToken.None);
            await store.JournalAsync([new RunRecordBuilder().Build()], CancellationToken.None);
        }

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.True(report.IsIntact, string.Join(Environment.NewLine, report.ProblemLines()));
        Assert.Equal(4, report.Database.Runs);
        Assert.Equal(HeadFile.Read(folder).Head!.Current.Anchor, report.Database.Anchor);
    }

    [Fact]
    public async Task VerifyAsync_TailDeleted_ReportsRunsMissingAfterTheLastRunLeft()
    {
        // Regression: deleting the last runs left a chain that verified as intact.
        var folder = await StoreAsync(runs: 5);
        Execute(folder, "DELETE FROM readings WHERE run_seq > 3; DELETE FROM runs WHERE seq > 3;");

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.False(report.IsIntact);
        Assert.True(report.Chain.IsIntact, "the chain alone cannot see a deleted tail");
        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.RunsMissing && p.Message.StartsWith("runs missing after seq 3", StringComparison.Ordinal));
    }

    [Fact]
    public async Task VerifyAsync_WalDeletedAfterAnUncleanStop_ReportsRunsMissingAfterTheCheckpointedRuns()
    {
        // Regression: after an unclean stop, deleting results.db-wal lost 6 committed runs without a word from verify.
        var folder = await StoreAsync(runs: 3);
        var copy = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(folder))
        {
            for (var i = 0; i < 6; i++)
            {
                await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            }

            // The store is still open (never checkpointed): what is on disk without the WAL is what a kill and a deleted WAL leave.
            File.Copy(ResultsDatabase.PathIn(folder), ResultsDatabase.PathIn(copy));
            File.Copy(HeadFile.PathIn(folder), HeadFile.PathIn(copy));
        }

        var report = await ProofVerifier.VerifyAsync(copy);

        Assert.False(report.IsIntact);
        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.RunsMissing && p.Message.StartsWith("runs missing after seq 3", StringComparison.Ordinal));
    }

    [Fact]
    public async Task VerifyAsync_OldBackupRestored_ReportsRunsMissingAfterTheBackupsLastRun()
    {
        // Regression: a copy of results.db taken earlier, put back, verified as intact.
        var folder = await StoreAsync(runs: 3);
        var old = Path.Combine(Some.TempDirectory(), "old.db");
        File.Copy(ResultsDatabase.PathIn(folder), old);
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        File.Copy(old, ResultsDatabase.PathIn(folder), overwrite: true);

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.RunsMissing && p.Message.StartsWith("runs missing after seq 3", StringComparison.Ordinal));
    }

    [Fact]
    public async Task VerifyAsync_OldBackupRestoredAndWrittenAgain_SetAsideHeadStillShowsTheLoss()
    {
        var folder = await StoreAsync(runs: 3);
        var old = Path.Combine(Some.TempDirectory(), "old.db");
        File.Copy(ResultsDatabase.PathIn(folder), old);
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        File.Copy(old, ResultsDatabase.PathIn(folder), overwrite: true);
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            Assert.Single(store.HeadsSetAside);
        }

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.HeadSetAside);
        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.RunReplaced || p.Kind == ProofProblemKind.RunsMissing);
    }

    [Fact]
    public async Task VerifyAsync_ForgedRelease_ReportsTheReleaseListChanged()
    {
        // Regression: a release row added with a sqlite3 shell let production run an unreleased file, and verify said intact.
        var folder = await StoreAsync(runs: 2);
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AddReleaseAsync(Release("a"), CancellationToken.None);
        }

        Execute(folder, "INSERT INTO releases (sequence_id, sequence_revision, sha256, released_by, released_utc, file) "
            + $"VALUES ('ctp40a-dac', 2, '{new string('b', 64)}', 'forger', '2026-12-03T06:00:00.0000000Z', 'x.json');");

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.ReleasesChanged);
    }

    [Fact]
    public async Task VerifyAsync_ForgedJournalEntry_ReportedBeforeAndAfterTheNextStartStoresIt()
    {
        // Regression: a journal row added outside LineTest was stored at the next start as a properly chained run.
        var folder = await StoreAsync(runs: 2);
        var forged = new RunRecordBuilder().WithSerial("CTP40A-2612-000666").Build();
        Execute(folder, "INSERT INTO runs_in_progress VALUES ($id, 'CTP40A-2612-000666', 1, NULL, '2026-12-03T06:00:00.0000000Z', '2026-12-03T06:00:00.0000000Z', $json);",
            ("$id", forged.Id.ToString("D")), ("$json", RunJson.Serialize(forged)));

        var before = await ProofVerifier.VerifyAsync(folder);
        Assert.Contains(before.Problems, p => p.Kind == ProofProblemKind.JournalChanged && p.Message.Contains(forged.Id.ToString("D"), StringComparison.Ordinal));

        await using (var store = SqliteResultStore.Open(folder))
        {
            var stored = Assert.Single((await store.RecoverAsync(CancellationToken.None)).Stored);
            Assert.Equal(SqliteResultStore.JournalUnprovenReason, stored.Reason);
        }

        var after = await ProofVerifier.VerifyAsync(folder);
        Assert.True(after.Chain.IsIntact);
        Assert.Contains(after.Problems, p => p.Kind == ProofProblemKind.JournalRunUnproven && p.Message.Contains("CTP40A-2612-000666", StringComparison.Ordinal));
        Assert.Contains(after.Problems, p => p.Kind == ProofProblemKind.HeadSetAside);
    }

    [Fact]
    public async Task VerifyAsync_ExpectedHeadStillStored_IsIntact_AndAfterTheTailIsLost_ReportsIt()
    {
        var folder = await StoreAsync(runs: 4);
        var anchor = HeadFile.Read(folder).Head!.Current;

        Assert.True((await ProofVerifier.VerifyAsync(folder, (anchor.Seq, anchor.Sha256))).IsIntact);

        // The tail and the head file both replaced by a forger who knew about the head: only the anchor kept elsewhere tells.
        Execute(folder, "DELETE FROM readings WHERE run_seq = 4; DELETE FROM runs WHERE seq = 4; UPDATE sqlite_sequence SET seq = 3 WHERE name = 'runs';");
        File.Delete(HeadFile.PathIn(folder));
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.JournalAsync([new RunRecordBuilder().Build()], CancellationToken.None);
        }

        Assert.True((await ProofVerifier.VerifyAsync(folder)).IsIntact, "a rewritten head hides the loss from the head alone");
        var report = await ProofVerifier.VerifyAsync(folder, (anchor.Seq, anchor.Sha256));
        Assert.Contains(report.Problems, p => p.Kind == ProofProblemKind.RunsMissing && p.Message.StartsWith("runs missing after seq 3", StringComparison.Ordinal));
    }

    [Fact]
    public async Task VerifyAsync_StoppedBetweenHeadAndCommit_IsIntactWithANote()
    {
        var folder = await StoreAsync(runs: 2);
        await using (var store = SqliteResultStore.Open(folder))
        {
            store.FaultPoint = p =>
            {
                if (p == "head-written")
                {
                    throw new InvalidOperationException("stopped");
                }
            };
            await Assert.ThrowsAsync<InvalidOperationException>(() => store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None));
        }

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.True(report.IsIntact, string.Join(Environment.NewLine, report.ProblemLines()));
        Assert.Single(report.Notes);
    }

    [Fact]
    public async Task VerifyAsync_SeveralRunsChanged_ListsEveryProblemNotOnlyTheFirst()
    {
        // Regression: verify reported only the first problem.
        var folder = await StoreAsync(runs: 6);
        Execute(folder, "UPDATE runs SET serial = 'X' WHERE seq IN (2, 5); DELETE FROM readings WHERE run_seq = 3;");

        var report = await ProofVerifier.VerifyAsync(folder);

        Assert.Equal(3, report.Chain.ProblemCount);
        Assert.Equal([2L, 3L, 5L], report.Chain.Problems.Select(p => p.Seq));
    }

    private static async Task<string> StoreAsync(int runs)
    {
        var folder = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(folder);
        for (var i = 0; i < runs; i++)
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        return folder;
    }

    private static Release Release(string hex) =>
        new("ctp40a-dac", 1, new string(hex[0], 64), "engineer", new DateTimeOffset(2026, 12, 1, 8, 0, 0, TimeSpan.Zero), "sequences/ctp40a-dac.json");

    private static void Execute(string folder, string sql, params (string Name, object Value)[] parameters)
    {
        using var connection = RawDb.Open(folder, SqliteOpenMode.ReadWrite);
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value);
        }

        command.ExecuteNonQuery();
    }
}
