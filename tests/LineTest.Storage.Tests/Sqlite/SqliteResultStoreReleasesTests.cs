using LineTest.Storage.Releases;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class SqliteResultStoreReleasesTests
{
    [Fact]
    public async Task AddReleaseAsync_ThenReopen_ReadsBackInOrder()
    {
        var directory = Some.TempDirectory();
        var first = new Release("ctp40a-dac", 1, new string('A', 64), "engineer one", new DateTimeOffset(2026, 3, 16, 6, 0, 0, TimeSpan.Zero), "/s/a.json");
        var second = first with { SequenceRevision = 2, Sha256 = new string('c', 64), ReleasedBy = "engineer two" };
        await using (var store = SqliteResultStore.Open(directory))
        {
            await store.AddReleaseAsync(first, CancellationToken.None);
            await store.AddReleaseAsync(second, CancellationToken.None);
        }

        await using var reopened = SqliteResultStore.Open(directory);
        var list = await reopened.ReadReleasesAsync(CancellationToken.None);

        Assert.Equal([first with { Sha256 = new string('a', 64) }, second], list);
    }
}
