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

    private static readonly Release Released =
        new("ctp40a-dac", 1, new string('a', 64), "engineer one", new DateTimeOffset(2026, 3, 16, 6, 0, 0, TimeSpan.Zero), "/s/ctp40a-dac.json");

    [Fact]
    public async Task AddReleaseAsync_SameFileTwice_KeepsOneReleaseAndSaysNothingChanged()
    {
        // Regression: releasing the same file twice added a duplicate row.
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);

        Assert.Equal(ReleaseOutcomeKind.Recorded, (await store.AddReleaseAsync(Released, CancellationToken.None)).Kind);
        var again = await store.AddReleaseAsync(Released with { ReleasedBy = "engineer two" }, CancellationToken.None);

        Assert.Equal(ReleaseOutcomeKind.AlreadyDone, again.Kind);
        Assert.StartsWith($"revision 1 of ctp40a-dac ({Released.Sha256}) is already released, by engineer one", again.Message, StringComparison.Ordinal);
        Assert.Single(await store.ReadReleasesAsync(CancellationToken.None));
    }

    [Fact]
    public async Task AddReleaseAsync_SameRevisionOtherContent_RefusedRaiseTheRevision()
    {
        // Regression: after a limit changed, the same id and revision was released again under a new SHA-256 without a word.
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);
        await store.AddReleaseAsync(Released, CancellationToken.None);

        var changed = await store.AddReleaseAsync(Released with { Sha256 = new string('b', 64) }, CancellationToken.None);

        Assert.Equal(ReleaseOutcomeKind.Refused, changed.Kind);
        Assert.StartsWith($"revision 1 of ctp40a-dac is already released as {Released.Sha256}", changed.Message, StringComparison.Ordinal);
        Assert.EndsWith("; raise the revision", changed.Message, StringComparison.Ordinal);
        Assert.Single(await store.ReadReleasesAsync(CancellationToken.None));
    }

    [Fact]
    public async Task RevokeAsync_ByPrefix_RecordedOnceAndTheFileCannotBeReleasedAgain()
    {
        var directory = Some.TempDirectory();
        var at = new DateTimeOffset(2026, 3, 17, 9, 0, 0, TimeSpan.Zero);
        await using var store = SqliteResultStore.Open(directory);
        await store.AddReleaseAsync(Released, CancellationToken.None);

        var revoked = await store.RevokeAsync("aaaaaaaa", "quality lead", "cold limit wrong", at, CancellationToken.None);
        var twice = await store.RevokeAsync(Released.Sha256, "quality lead", "again", at, CancellationToken.None);
        var rereleased = await store.AddReleaseAsync(Released, CancellationToken.None);

        Assert.Equal(ReleaseOutcomeKind.Recorded, revoked.Kind);
        Assert.Equal(ReleaseOutcomeKind.AlreadyDone, twice.Kind);
        Assert.Equal(ReleaseOutcomeKind.Refused, rereleased.Kind);
        Assert.Equal([new Revocation(Released.Sha256, "quality lead", at, "cold limit wrong")], await store.ReadRevocationsAsync(CancellationToken.None));
    }

    [Theory]
    [InlineData("abc", "is not a SHA-256")]
    [InlineData("cccccccc", "no released file has SHA-256")]
    public async Task RevokeAsync_UnknownOrShortHash_Refused(string sha, string expected)
    {
        var directory = Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);
        await store.AddReleaseAsync(Released, CancellationToken.None);

        var outcome = await store.RevokeAsync(sha, "quality lead", "why", Released.ReleasedUtc, CancellationToken.None);

        Assert.Equal(ReleaseOutcomeKind.Refused, outcome.Kind);
        Assert.Contains(expected, outcome.Message, StringComparison.Ordinal);
        Assert.Empty(await store.ReadRevocationsAsync(CancellationToken.None));
    }
}
