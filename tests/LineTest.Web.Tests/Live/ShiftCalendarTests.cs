using LineTest.Web.Live;

namespace LineTest.Web.Tests.Live;

public sealed class ShiftCalendarTests
{
    private static readonly ShiftCalendar ThreeShifts = new([new(6, 0), new(14, 0), new(22, 0)]);

    [Theory]
    [InlineData("2026-12-03T06:00:00Z", "2026-12-03T06:00:00Z", "2026-12-03T14:00:00Z")]
    [InlineData("2026-12-03T13:59:59Z", "2026-12-03T06:00:00Z", "2026-12-03T14:00:00Z")]
    [InlineData("2026-12-03T14:00:00Z", "2026-12-03T14:00:00Z", "2026-12-03T22:00:00Z")]
    [InlineData("2026-12-03T23:30:00Z", "2026-12-03T22:00:00Z", "2026-12-04T06:00:00Z")]
    [InlineData("2026-12-04T02:00:00Z", "2026-12-03T22:00:00Z", "2026-12-04T06:00:00Z")]
    public void ShiftOf_NightShiftAcrossMidnight_OneShift(string at, string start, string end)
    {
        var (s, e) = ThreeShifts.ShiftOf(DateTimeOffset.Parse(at, System.Globalization.CultureInfo.InvariantCulture));

        Assert.Equal(DateTimeOffset.Parse(start, System.Globalization.CultureInfo.InvariantCulture), s);
        Assert.Equal(DateTimeOffset.Parse(end, System.Globalization.CultureInfo.InvariantCulture), e);
    }

    [Fact]
    public void ShiftOf_OneStart_TwentyFourHours()
    {
        var (s, e) = new ShiftCalendar([new(7, 30)]).ShiftOf(new DateTimeOffset(2026, 12, 3, 3, 0, 0, TimeSpan.Zero));

        Assert.Equal(new DateTimeOffset(2026, 12, 2, 7, 30, 0, TimeSpan.Zero), s);
        Assert.Equal(new DateTimeOffset(2026, 12, 3, 7, 30, 0, TimeSpan.Zero), e);
    }
}
