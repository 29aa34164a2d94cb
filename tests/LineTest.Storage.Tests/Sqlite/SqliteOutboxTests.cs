using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteOutboxTests
{
    private const string Factory = "3f0c2b1e-0000-4000-8000-000000000001";

    [Fact]
    public async Task ReadPendingAsync_AfterMarkForwarded_OnlyLaterRunsInSeqOrder()
    {
        var directory = Some.TempDirectory();
        var runs = Enumerable.Range(0, 5).Select(i => new RunRecordBuilder().StartedAt(new DateTimeOffset(2026, 3, 2, 6, i, 0, TimeSpan.Zero)).Build()).ToList();
        await using (var store = SqliteResultStore.Open(directory))
        {
            foreach (var run in runs)
            {
                await store.AppendAsync(run, CancellationToken.None);
            }
        }

        await using var outbox = SqliteOutbox.Open(directory);
        Assert.Equal(runs.Select(r => r.Id), (await outbox.ReadPendingAsync(Factory, 10)).Select(r => r.Id));

        await outbox.MarkForwardedAsync(Factory, 3, DateTimeOffset.UnixEpoch);
        var pending = await outbox.ReadPendingAsync(Factory, 10);
        var backlog = await outbox.ReadBacklogAsync(Factory);

        Assert.Equal([4L, 5L], pending.Select(r => r.Seq));
        Assert.Equal(new OutboxBacklog(2, runs[3].EndedUtc, 3), backlog);
        // Another factory database has its own watermark.
        Assert.Equal(5, (await outbox.ReadPendingAsync("another", 10)).Count);
    }

    [Fact]
    public async Task MarkForwardedAsync_LowerSeqLater_WatermarkNeverMovesBack()
    {
        var directory = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        await using var outbox = SqliteOutbox.Open(directory);
        await outbox.MarkForwardedAsync(Factory, 2, DateTimeOffset.UnixEpoch);
        await outbox.MarkForwardedAsync(Factory, 1, DateTimeOffset.UnixEpoch.AddHours(1));

        Assert.Equal(new OutboxBacklog(0, null, 2), await outbox.ReadBacklogAsync(Factory));
        Assert.Equal(Factory, await outbox.ReadLastFactoryIdAsync());
    }

    [Fact]
    public void Open_NoDatabaseYet_RefusedWithoutCreatingOne()
    {
        var directory = Some.TempDirectory();

        var refused = Assert.Throws<ResultStoreException>(() => SqliteOutbox.Open(directory));

        Assert.Equal(ResultStoreFailure.CannotOpen, refused.Failure);
        Assert.False(File.Exists(ResultsDatabase.PathIn(directory)));
    }

    [Fact]
    public async Task Open_SameFileTwice_SameChainId()
    {
        var directory = Some.TempDirectory();
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AppendAsync(new RunRecordBuilder().Build(), CancellationToken.None);
        }

        string first;
        await using (var outbox = SqliteOutbox.Open(directory))
        {
            first = outbox.ChainId;
        }

        await using var again = SqliteOutbox.Open(directory);
        Assert.Equal(32, first.Length);
        Assert.Equal(first, again.ChainId);
    }
}
