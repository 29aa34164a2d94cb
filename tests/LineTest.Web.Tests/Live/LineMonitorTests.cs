using LineTest.Web.Hosting;
using LineTest.Web.Live;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Web.Tests.Live;

public sealed class LineMonitorTests
{
    [Fact]
    public async Task LookAsync_LooksWithinHalfTheRefreshInterval_ShareOneReading()
    {
        var source = new MarkCountingSource();
        var clock = new FakeTimeProvider(PageHost.Now);
        using var monitor = new LineMonitor(source, new ShiftCalendar([new TimeOnly(6, 0)]), clock, new WebPageOptions { RefreshSeconds = 2 });

        var first = await monitor.LookAsync(CancellationToken.None);
        source.Mark = "2";
        clock.Advance(TimeSpan.FromSeconds(0.9));
        var second = await monitor.LookAsync(CancellationToken.None);

        Assert.Equal(1, source.MarkReads);
        Assert.Equal(1, source.RecentReads);
        Assert.Equal(first.Mark, second.Mark);
        Assert.Equal("ST-01", Assert.Single(second.Tiles).Name);

        // Half the interval later the mark is read again, and the tiles made again because it moved.
        clock.Advance(TimeSpan.FromSeconds(0.1));
        var third = await monitor.LookAsync(CancellationToken.None);

        Assert.Equal(2, source.MarkReads);
        Assert.Equal(2, source.RecentReads);
        Assert.NotEqual(first.Mark, third.Mark);
    }

    [Fact]
    public async Task LookAsync_MarkUnchanged_TilesNotMadeAgainUntilAMinutePassed()
    {
        var source = new MarkCountingSource();
        var clock = new FakeTimeProvider(PageHost.Now);
        using var monitor = new LineMonitor(source, new ShiftCalendar([new TimeOnly(6, 0)]), clock, new WebPageOptions());

        await monitor.LookAsync(CancellationToken.None);
        clock.Advance(TimeSpan.FromSeconds(30));
        await monitor.LookAsync(CancellationToken.None);
        clock.Advance(TimeSpan.FromSeconds(31));
        await monitor.LookAsync(CancellationToken.None);

        Assert.Equal(3, source.MarkReads);
        Assert.Equal(2, source.RecentReads);
    }
}
