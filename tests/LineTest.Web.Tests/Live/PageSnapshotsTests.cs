using LineTest.Web.Live;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Web.Tests.Live;

public sealed class PageSnapshotsTests
{
    [Fact]
    public async Task GetAsync_WithinMaxAge_ServesThePageAsMadeEvenWhileRunsArrive()
    {
        var source = new MarkCountingSource();
        var clock = new FakeTimeProvider(PageHost.Now);
        using var snapshots = new PageSnapshots(source, clock);
        var made = 0;
        Task<string> Make() => Task.FromResult("page " + ++made);

        var first = await snapshots.GetAsync("/yield", Make, CancellationToken.None);
        source.Mark = "2";
        clock.Advance(PageSnapshots.MaxAge - TimeSpan.FromSeconds(1));
        var second = await snapshots.GetAsync("/yield", Make, CancellationToken.None);

        Assert.Equal("page 1", first);
        Assert.Equal("page 1", second);
        Assert.Equal(1, made);
    }

    [Fact]
    public async Task GetAsync_AfterMaxAge_MadeAgainOnlyWhenTheResultsChanged()
    {
        var source = new MarkCountingSource();
        var clock = new FakeTimeProvider(PageHost.Now);
        using var snapshots = new PageSnapshots(source, clock);
        var made = 0;
        Task<string> Make() => Task.FromResult("page " + ++made);

        await snapshots.GetAsync("/yield", Make, CancellationToken.None);
        clock.Advance(PageSnapshots.MaxAge);
        var unchanged = await snapshots.GetAsync("/yield", Make, CancellationToken.None);
        source.Mark = "2";
        clock.Advance(PageSnapshots.MaxAge);
        var changed = await snapshots.GetAsync("/yield", Make, CancellationToken.None);
        var otherView = await snapshots.GetAsync("/yield?station=ST-02", Make, CancellationToken.None);

        Assert.Equal("page 1", unchanged);
        Assert.Equal("page 2", changed);
        Assert.Equal("page 3", otherView);
    }

    // Found in review: a /yield page without dates shows the last days up to today, but an idle station's page was kept
    // while the results did not change, so after midnight it still showed yesterday's window.
    [Fact]
    public async Task GetAsync_ResultsUnchangedButTheDayTurned_MadeAgain()
    {
        var source = new MarkCountingSource();
        var beforeMidnight = new DateTimeOffset(2026, 12, 3, 23, 59, 55, TimeSpan.Zero);
        var clock = new FakeTimeProvider(beforeMidnight);
        using var snapshots = new PageSnapshots(source, clock);
        var made = 0;
        Task<string> Make() => Task.FromResult($"page {++made} of {clock.GetUtcNow():yyyy-MM-dd}");

        await snapshots.GetAsync("/yield", Make, CancellationToken.None);
        clock.Advance(TimeSpan.FromSeconds(10));
        var afterMidnight = await snapshots.GetAsync("/yield", Make, CancellationToken.None);

        Assert.Equal("page 2 of 2026-12-04", afterMidnight);
    }
}
