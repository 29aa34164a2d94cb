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
}
