using System.Text.Json;
using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.TestSupport;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Cli;

public sealed class ReportCommandTests
{
    private const string Readings =
        "serial,name,value,unit,low,high,slot\n" +
        "A1,offset,5,V,0,10,1\n" +
        "A2,offset,not-a-number,V,0,10,2\n" +
        "A3,offset,6,V,0,10,1\n" +
        "A4,offset,4.5,V,0,10,2\n";

    private static Task<(int ExitCode, string Stdout, string Stderr)> RunAsync(params string[] args) => RunWithSettingsAsync([], args);

    private static async Task<(int ExitCode, string Stdout, string Stderr)> RunWithSettingsAsync(Dictionary<string, string?> settings, params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        var configuration = new ConfigurationBuilder().AddInMemoryCollection(settings).Build();
        var options = new StationOptions();
        configuration.GetSection("Station").Bind(options);
        var context = new CliContext(Some.TempDirectory(), configuration, options, stdout, stderr, NullLoggerFactory.Instance);
        var code = await StationCommandLine.InvokeAsync(context, args, CancellationToken.None);
        return (code, stdout.ToString(), stderr.ToString());
    }

    private static string WriteCsv()
    {
        var path = Path.Combine(Some.TempDirectory(), "readings.csv");
        File.WriteAllText(path, Readings);
        return path;
    }

    [Fact]
    public async Task Invoke_CsvWithBadRow_ExitsTwoNamingTheLine()
    {
        var path = WriteCsv();

        var (code, _, stderr) = await RunAsync("report", "--readings", path);

        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("line 3: value 'not-a-number' is not a number", stderr, StringComparison.Ordinal);
        Assert.Contains("--skip-bad-rows", stderr, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Invoke_CsvWithBadRowSkipped_ReportsOnTheRest()
    {
        var path = WriteCsv();

        var (code, stdout, stderr) = await RunAsync("report", "--readings", path, "--skip-bad-rows", "--json");

        Assert.Equal(ExitCodes.Done, code);
        Assert.Contains("skipped 1 bad row", stderr, StringComparison.Ordinal);
        using var json = JsonDocument.Parse(stdout);
        Assert.Equal(3, json.RootElement.GetProperty("yield").GetProperty("runs").GetInt32());
        Assert.Equal(3, json.RootElement.GetProperty("readings")[0].GetProperty("n").GetInt32());
    }

    [Fact]
    public async Task Invoke_MissingDatabase_ExitsTwo()
    {
        var (code, _, stderr) = await RunAsync("report", "--results", Path.Combine(Some.TempDirectory(), "nothing-here"));

        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("does not exist", stderr, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("--from", "yesterday")]
    [InlineData("--by", "colour")]
    public async Task Invoke_BadOption_ExitsTwo(string option, string value)
    {
        var (code, _, stderr) = await RunAsync("report", "--readings", WriteCsv(), option, value);

        Assert.Equal(ExitCodes.BadInput, code);
        Assert.NotEqual(string.Empty, stderr);
    }

    [Fact]
    public async Task Invoke_HtmlAndCsv_WritesBothFiles()
    {
        var folder = Some.TempDirectory();
        var html = Path.Combine(folder, "report.html");
        var csv = Path.Combine(folder, "report.csv");

        var (code, stdout, _) = await RunAsync("report", "--readings", WriteCsv(), "--skip-bad-rows", "--html", html, "--csv", csv);

        Assert.Equal(ExitCodes.Done, code);
        Assert.Contains("Capability", stdout, StringComparison.Ordinal);
        Assert.StartsWith("<!DOCTYPE html>", await File.ReadAllTextAsync(html), StringComparison.Ordinal);
        Assert.StartsWith("name,unit,low,high,n,", await File.ReadAllTextAsync(csv), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("2025-03-04", false, "2025-03-04T00:00:00+00:00")]
    [InlineData("2025-03-04", true, "2025-03-05T00:00:00+00:00")]
    [InlineData("2025-03-04T06:30:00Z", true, "2025-03-04T06:30:00+00:00")]
    [InlineData("2025-03-04T06:30:00", false, "2025-03-04T06:30:00+00:00")]
    public void TryInstant_DateOrTime_IsUtcAndToIncludesTheDay(string text, bool endOfDay, string expected)
    {
        Assert.True(ReportFilterOptions.TryInstant(text, endOfDay, out var instant, out _));
        Assert.Equal(DateTimeOffset.Parse(expected, System.Globalization.CultureInfo.InvariantCulture), instant);
    }

    /// <summary>Three runs at 07:00, 13:00 and 19:00 UTC of one day.</summary>
    private static async Task<string> ThreeRunsOfADayAsync()
    {
        var folder = Some.TempDirectory();
        await using var store = LineTest.Storage.Sqlite.SqliteResultStore.Open(folder);
        foreach (var hour in new[] { 7, 13, 19 })
        {
            await store.AppendAsync(
                new LineTest.TestSupport.Builders.RunRecordBuilder().WithSerial($"CTP40A-2612-0000{hour:D2}")
                    .StartedAt(new DateTimeOffset(2026, 12, 1, hour, 0, 0, TimeSpan.Zero).AddMinutes(-10), TimeSpan.FromMinutes(10)).Build(),
                CancellationToken.None);
        }

        return folder;
    }

    private static List<string> GroupKeys(string json)
    {
        using var document = JsonDocument.Parse(json);
        return [.. document.RootElement.GetProperty("groups").GetProperty("items").EnumerateArray().Select(g => g.GetProperty("key").GetString()!)];
    }

    // Regression: report --by shift read Station:Shifts while the live page read Station:Web:ShiftStartsUtc; both read
    // Station:Shifts now (the page's side is tested in LineTest.Web.Tests, ShiftSettingsTests).
    [Fact]
    public async Task Report_ByShift_ShiftsFromStationShifts()
    {
        var folder = await ThreeRunsOfADayAsync();

        var (code, stdout, stderr) = await RunWithSettingsAsync(
            new() { ["Station:Shifts:day"] = "06:00", ["Station:Shifts:swing"] = "18:00" }, "report", "--results", folder, "--by", "shift", "--json");

        Assert.True(code == 0, stderr);
        Assert.Equal(["day", "swing"], GroupKeys(stdout).Order(StringComparer.Ordinal));
    }

    [Fact]
    public async Task Report_ByShift_OldPageSettingAloneStillNamesTheShifts()
    {
        var folder = await ThreeRunsOfADayAsync();

        var (code, stdout, stderr) = await RunWithSettingsAsync(
            new() { ["Station:Web:ShiftStartsUtc:0"] = "12:00", ["Station:Web:ShiftStartsUtc:1"] = "00:00" }, "report", "--results", folder, "--by", "shift", "--json");

        Assert.True(code == 0, stderr);
        Assert.Equal(["00:00", "12:00"], GroupKeys(stdout).Order(StringComparer.Ordinal));
    }

    [Fact]
    public async Task Report_ByShift_BadShiftSetting_Exit2NamingIt()
    {
        var folder = await ThreeRunsOfADayAsync();

        var (code, _, stderr) = await RunWithSettingsAsync(new() { ["Station:Shifts:day"] = "6am" }, "report", "--results", folder, "--by", "shift");

        Assert.Equal(2, code);
        Assert.Contains("Station:Shifts: shift 'day=6am' is not name=HH:mm", stderr, StringComparison.Ordinal);
    }
}
