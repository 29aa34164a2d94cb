using LineTest.Storage.Backup;
using LineTest.Storage.Proof;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Backup;

public sealed class ResultsBackupTests
{
    [Fact]
    public async Task CreateAsync_WhileAStoreKeepsWriting_CopyRestoresToAFolderThatVerifies()
    {
        var folder = Some.TempDirectory();
        var target = Path.Combine(Some.TempDirectory(), "shift.db");
        await using var store = SqliteResultStore.Open(folder);
        for (var i = 0; i < 5; i++)
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        using var stop = new CancellationTokenSource();
        var writing = Task.Run(async () =>
        {
            while (!stop.IsCancellationRequested)
            {
                await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
                await store.JournalAsync([new RunRecordBuilder().Build()], CancellationToken.None);
            }
        });

        BackupResult result;
        try
        {
            await Task.Delay(200);
            result = await ResultsBackup.CreateAsync(folder, target, CancellationToken.None);
        }
        finally
        {
            await stop.CancelAsync();
            await writing;
        }

        Assert.Null(result.Problem);
        Assert.Null(result.Warning);
        var restored = Some.TempDirectory();
        File.Copy(target, ResultsDatabase.PathIn(restored));
        File.Copy(target + ".head", HeadFile.PathIn(restored));
        var report = await ProofVerifier.VerifyAsync(restored);
        Assert.True(report.IsIntact, string.Join(Environment.NewLine, report.ProblemLines()));
        Assert.True(report.Database.Runs >= 5);
        Assert.Equal(result.Head!.Anchor, report.Database.Anchor);
    }

    [Fact]
    public async Task CreateAsync_WriterCommitsTwiceBetweenSnapshotAndHead_NoWarningAndTheCopyVerifies()
    {
        // Regression (seen once in CI under load): the copy's snapshot was taken, then the head file read. A writer that
        // committed and began its next write in between had replaced the head twice, so neither of the head's two states
        // was the snapshot's, and the backup of an untouched folder warned "did not match its head".
        var folder = Some.TempDirectory();
        var target = Path.Combine(Some.TempDirectory(), "shift.db");
        await using var store = SqliteResultStore.Open(folder);
        await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);

        var result = await ResultsBackup.CreateAsync(folder, target, CancellationToken.None, raceWindow: async () =>
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            await store.JournalAsync([new RunRecordBuilder().Build()], CancellationToken.None);
        });

        Assert.Null(result.Problem);
        Assert.Null(result.Warning);
        Assert.Equal(2, result.Head!.Runs);
        var restored = Some.TempDirectory();
        File.Copy(target, ResultsDatabase.PathIn(restored));
        File.Copy(target + ".head", HeadFile.PathIn(restored));
        var report = await ProofVerifier.VerifyAsync(restored);
        Assert.True(report.IsIntact, string.Join(Environment.NewLine, report.ProblemLines()));
        Assert.Equal(2, report.Database.Runs);
    }

    [Fact]
    public async Task CreateAsync_TargetExists_RefusedAndNothingOverwritten()
    {
        var folder = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(folder))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        var target = Path.Combine(Some.TempDirectory(), "keep.db");
        File.WriteAllText(target, "precious");

        var result = await ResultsBackup.CreateAsync(folder, target, CancellationToken.None);

        Assert.Contains("already exists", result.Problem, StringComparison.Ordinal);
        Assert.Equal("precious", File.ReadAllText(target));
    }
}
