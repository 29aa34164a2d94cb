using LineTest.Reports.Loading;
using LineTest.Web.Hosting;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Tests.Hosting;

public sealed class ShiftSettingsTests
{
    private static IConfiguration Config(Dictionary<string, string?> values) => new ConfigurationBuilder().AddInMemoryCollection(values).Build();

    [Fact]
    public void Read_NothingSet_EarlyLateNight()
    {
        var (shifts, error, warning) = ShiftSettings.Read(Config([]));

        Assert.Null(error);
        Assert.Null(warning);
        Assert.Equal([new TimeOnly(6, 0), new TimeOnly(14, 0), new TimeOnly(22, 0)], shifts!.Starts);
    }

    [Fact]
    public void Read_StationShifts_NamesAndStartsFromIt()
    {
        var (shifts, error, warning) = ShiftSettings.Read(Config(new() { ["Station:Shifts:day"] = "07:30", ["Station:Shifts:swing"] = "19:30" }));

        Assert.Null(error);
        Assert.Null(warning);
        Assert.Equal([new TimeOnly(7, 30), new TimeOnly(19, 30)], shifts!.Starts);
        Assert.Equal("swing", shifts.ShiftOf(new DateTimeOffset(2026, 12, 3, 2, 0, 0, TimeSpan.Zero)));
    }

    // Regression: the reports read Station:Shifts and the live page Station:Web:ShiftStartsUtc, so one factory had two
    // shift calendars. Now Station:Shifts wins and the old key is reported as ignored.
    [Fact]
    public void Read_BothSettings_StationShiftsWinsAndTheOldKeyIsReportedIgnored()
    {
        var (shifts, error, warning) = ShiftSettings.Read(Config(new()
        {
            ["Station:Shifts:day"] = "07:30",
            ["Station:Shifts:swing"] = "19:30",
            ["Station:Web:ShiftStartsUtc:0"] = "06:00",
        }));

        Assert.Null(error);
        Assert.Equal([new TimeOnly(7, 30), new TimeOnly(19, 30)], shifts!.Starts);
        Assert.Contains("Station:Web:ShiftStartsUtc is no longer read", warning, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_OnlyTheOldPageSetting_StillReadWithADeprecationWarning()
    {
        var (shifts, error, warning) = ShiftSettings.Read(Config(new() { ["Station:Web:ShiftStartsUtc:0"] = "18:00", ["Station:Web:ShiftStartsUtc:1"] = "06:00" }));

        Assert.Null(error);
        Assert.Equal([new TimeOnly(6, 0), new TimeOnly(18, 0)], shifts!.Starts);
        Assert.Equal("06:00", shifts.ShiftOf(new DateTimeOffset(2026, 12, 3, 12, 0, 0, TimeSpan.Zero)));
        Assert.Contains("Station:Web:ShiftStartsUtc is deprecated", warning, StringComparison.Ordinal);
        Assert.Contains("Station:Shifts", warning, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("Station:Shifts:day", "25:00", "Station:Shifts: shift 'day=25:00' is not name=HH:mm")]
    [InlineData("Station:Web:ShiftStartsUtc:0", "6 o'clock", "Station:Web:ShiftStartsUtc: '6 o'clock' is not a time of day HH:mm")]
    [InlineData("Station:Web:ShiftStartsUtc:0", "25:00", "Station:Web:ShiftStartsUtc: '25:00' is not a time of day HH:mm")]
    public void Read_BadEntry_ErrorNamesTheSettingAndTheEntry(string key, string value, string expected)
    {
        var (shifts, error, _) = ShiftSettings.Read(Config(new() { [key] = value }));

        Assert.Null(shifts);
        Assert.StartsWith(expected, error, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_OldStartListedTwice_IsAnError()
    {
        var (shifts, error, _) = ShiftSettings.Read(Config(new() { ["Station:Web:ShiftStartsUtc:0"] = "06:00", ["Station:Web:ShiftStartsUtc:1"] = "06:00" }));

        Assert.Null(shifts);
        Assert.StartsWith("Station:Web:ShiftStartsUtc: ", error, StringComparison.Ordinal);
    }

    [Fact]
    public void AddStationWebPage_BadStationShifts_RefusesBeforeTheStationStarts()
    {
        var services = new ServiceCollection();

        var ex = Assert.Throws<InvalidOperationException>(() => services.AddStationWebPage(
            Config(new() { ["Station:Web:Listen"] = "127.0.0.1:5080", ["Station:Shifts:day"] = "7h" }), "results"));

        Assert.Contains("Station:Shifts: shift 'day=7h'", ex.Message, StringComparison.Ordinal);
    }

    // Found when trying the settings as a station would: the page's own options still checked the old key too, so a
    // bad old start was reported twice, and blocked the page even when Station:Shifts (which wins) was set.
    [Fact]
    public void AddStationWebPage_BadOldStart_ReportedOnce()
    {
        var services = new ServiceCollection();

        var ex = Assert.Throws<InvalidOperationException>(() => services.AddStationWebPage(
            Config(new() { ["Station:Web:Listen"] = "127.0.0.1:5080", ["Station:Web:ShiftStartsUtc:0"] = "6h" }), "results"));

        Assert.Single(System.Text.RegularExpressions.Regex.Matches(ex.Message, "'6h'"));
    }

    [Fact]
    public void AddStationWebPage_BadOldStartBesideStationShifts_PageStartsAndTheOldKeyIsIgnored()
    {
        var services = new ServiceCollection();

        var added = services.AddStationWebPage(
            Config(new() { ["Station:Web:Listen"] = "127.0.0.1:5080", ["Station:Shifts:day"] = "07:00", ["Station:Web:ShiftStartsUtc:0"] = "6h" }),
            "results");

        Assert.True(added);
    }

    [Fact]
    public async Task AddStationWebPage_OldPageSetting_LogsTheDeprecationWhenThePageIsMade()
    {
        var log = new RecordingLoggerProvider();
        var services = new ServiceCollection();
        services.AddSingleton(LoggerFactory.Create(b => b.AddProvider(log)));
        Assert.True(services.AddStationWebPage(Config(new() { ["Station:Web:Listen"] = "127.0.0.1:0", ["Station:Web:ShiftStartsUtc:0"] = "06:00" }), "results"));

        await using var provider = services.BuildServiceProvider();
        _ = provider.GetRequiredService<IHostedService>();

        Assert.Contains(log.Messages, m => m.EventId == 4090 && m.Message.Contains("Station:Web:ShiftStartsUtc is deprecated", StringComparison.Ordinal));
    }

    [Fact]
    public async Task LinePage_ShiftsFromTheSetting_ThisShiftStartsAtTheNamedShift()
    {
        // PageHost's clock reads 2026-12-03 10:00 UTC: in a shift that starts 09:30, not in the default 06:00 one.
        var (shifts, _, _) = ShiftSettings.Read(Config(new() { ["Station:Shifts:early"] = "01:30", ["Station:Shifts:day"] = "09:30", ["Station:Shifts:late"] = "17:30" }));
        await using var host = await PageHost.StartAsync(shifts: shifts);

        var (_, body, _) = await host.SendAsync("/");

        Assert.Contains("Shift from 2026-12-03 09:30", body, StringComparison.Ordinal);
    }
}
