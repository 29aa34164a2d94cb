using System.Net;
using System.Text.RegularExpressions;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;
using LineTest.Web.Tests.Support;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Web.Tests.Hosting;

/// <summary>The page's routes on the test host, from this computer (loopback).</summary>
public sealed partial class WebPageEndpointsTests : IAsyncLifetime
{
    private PageHost _host = null!;

    public async Task InitializeAsync() => _host = await PageHost.StartAsync();

    public async Task DisposeAsync() => await _host.DisposeAsync();

    [Fact]
    public async Task Line_TwoFolders_OneTilePerStationWithShiftFigures()
    {
        var (status, html, _) = await _host.SendAsync("/");

        Assert.Equal(HttpStatusCode.OK, status);
        var st01 = Tile(html, "ST-01");
        var st02 = Tile(html, "ST-02");

        // [derived] hand count of PageHost's runs: ST-01 has 22 runs in the 06:00–14:00 shift (20 units, two retests);
        // 17 of 20 units passed their first run (units 7 and 14 failed first, unit 11 erred) → 85.0 %; 22 runs
        // from 06:00 to the last run at 10:00 → 5.5 units per hour.
        Assert.Equal("22", Figure(st01, "shift-runs"));
        Assert.Equal("85.0 %", Figure(st01, "shift-fpy"));
        Assert.Equal("85.0 %", Figure(st01, "today-fpy"));
        Assert.Equal("5.5", Figure(st01, "units-per-hour"));
        Assert.Contains("CTP40A-2612-000020", st01, StringComparison.Ordinal);
        Assert.Equal("5", Figure(st02, "shift-runs"));
        Assert.Equal("100.0 %", Figure(st02, "shift-fpy"));
        Assert.Contains("idle since", st02, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Line_PageInsideAForwardingStation_TileShowsTheStationsOwnBacklog()
    {
        var backlog = new FixedBacklog(new LineTest.Factory.Forwarding.FactoryBacklogStatus(
            3, new DateTimeOffset(2026, 12, 3, 9, 40, 0, TimeSpan.Zero), null, "connection refused", 4));
        await using var host = await PageHost.StartAsync(
            Directory.CreateTempSubdirectory("linetest-web-backlog-").FullName, new LineTest.Web.Data.SqliteFolderSource([_host.StationA], backlog));

        var (_, waiting, _) = await host.SendAsync("/");
        backlog.Current = new LineTest.Factory.Forwarding.FactoryBacklogStatus(0, null, PageHost.Now, null, 0);
        host.Clock.Advance(TimeSpan.FromSeconds(5));
        var (_, caughtUp, _) = await host.SendAsync("/");

        Assert.Equal("factory: 3 run(s) waiting since 2026-12-03 09:40 UTC (connection refused; attempt 4)", Figure(Tile(waiting, "ST-01"), "backlog"));
        Assert.Equal("factory: up to date", Figure(Tile(caughtUp, "ST-01"), "backlog"));
        Assert.DoesNotContain("data-key=\"backlog\"", (await _host.SendAsync("/")).Body, StringComparison.Ordinal);
    }

    [Fact]
    public async Task LineEvents_FirstEvent_CarriesTheTiles()
    {
        using var cancel = new CancellationTokenSource();
        var server = _host.App.GetTestServer();
        using var client = new HttpClient(server.CreateHandler(c => c.Connection.RemoteIpAddress = IPAddress.Loopback)) { BaseAddress = server.BaseAddress };
        using var request = new HttpRequestMessage(HttpMethod.Get, "/line/events");
        using var response = await client.SendAsync(request, HttpCompletionOption.ResponseHeadersRead, cancel.Token);
        Assert.Equal("text/event-stream", response.Content.Headers.ContentType?.MediaType);
        await using var stream = await response.Content.ReadAsStreamAsync(cancel.Token);
        using var reader = new StreamReader(stream);
        var first = await reader.ReadLineAsync(cancel.Token);
        var data = await reader.ReadLineAsync(cancel.Token);
        await cancel.CancelAsync();

        Assert.Equal("event: tiles", first);
        Assert.StartsWith("data: {\"html\":", data, StringComparison.Ordinal);
        Assert.Contains("ST-01", data, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Yield_StationFilterInUrl_CountsOnlyThatStation()
    {
        var (all, allHtml, _) = await _host.SendAsync("/yield");
        var (one, oneHtml, _) = await _host.SendAsync("/yield?station=ST-02");

        Assert.Equal(HttpStatusCode.OK, all);
        Assert.Equal(HttpStatusCode.OK, one);
        Assert.Contains("<th scope=\"row\">Runs</th><td>27</td>", allHtml, StringComparison.Ordinal);
        Assert.Contains("<th scope=\"row\">Runs</th><td>5</td>", oneHtml, StringComparison.Ordinal);
        Assert.Contains("value=\"ST-02\"", oneHtml, StringComparison.Ordinal);

        // The failure Pareto names the failing reading of both failed runs, and links its chart with the filters.
        Assert.Matches("<td>verify.error</td><td class=\"n\">2</td>", allHtml);
        Assert.Contains("src=\"/yield/pareto.svg?from=2026-11-27&amp;to=2026-12-03\"", allHtml, StringComparison.Ordinal);
        Assert.Contains("2026-12-03 06:00", allHtml, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Yield_NoDates_ReadsOnlyTheLastSevenDaysAndShowsThemInTheFilters()
    {
        // Four runs of ST-02 ended on 2026-11-20, before the default window (2026-11-27 … 2026-12-03).
        await PageHost.WriteAsync(_host.StationB, Enumerable.Range(1, 4).Select(i => new LineTest.TestSupport.Builders.RunRecordBuilder()
            .WithSerial($"CTP40A-2611-2000{i:D2}").WithStation("ST-02").WithLot("L-OLD")
            .StartedAt(new DateTimeOffset(2026, 11, 20, 8, 0, 0, TimeSpan.Zero).AddMinutes(15 * i)).WithReadings(PageHost.Readings(0.01, PageHost.Now)).Build()));

        var (status, html, _) = await _host.SendAsync("/yield");
        var (_, allHtml, _) = await _host.SendAsync("/yield?from=2026-11-01");

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains("<th scope=\"row\">Runs</th><td>27</td>", html, StringComparison.Ordinal);
        Assert.Contains("name=\"from\" value=\"2026-11-27\"", html, StringComparison.Ordinal);
        Assert.Contains("name=\"to\" value=\"2026-12-03\"", html, StringComparison.Ordinal);
        Assert.Contains("The last 7 days", html, StringComparison.Ordinal);
        Assert.Contains("from=2026-11-27&amp;to=2026-12-03", html, StringComparison.Ordinal);
        Assert.Contains("<th scope=\"row\">Runs</th><td>31</td>", allHtml, StringComparison.Ordinal);
        Assert.DoesNotContain("The last 7 days", allHtml, StringComparison.Ordinal);

        // The window reaches the source: it is asked for those days only, not for every run to be cut afterwards.
        var (query, withReadings) = _host.Source.Loads.First();
        Assert.False(withReadings);
        Assert.Equal(new DateTimeOffset(2026, 11, 27, 0, 0, 0, TimeSpan.Zero), query.FromUtc);
        Assert.Equal(new DateTimeOffset(2026, 12, 4, 0, 0, 0, TimeSpan.Zero), query.ToUtc);
    }

    [Fact]
    public async Task Yield_BadDate_SaysWhyWith400()
    {
        var (status, html, _) = await _host.SendAsync("/yield?from=03.12.2026");

        Assert.Equal(HttpStatusCode.BadRequest, status);
        Assert.Contains("&#39;from&#39; must be a date like 2026-12-03, not &#39;03.12.2026&#39;", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Yield_UnknownProduct_SaysSo()
    {
        var (status, html, _) = await _host.SendAsync("/yield?product=CTP-99");

        Assert.Equal(HttpStatusCode.BadRequest, status);
        Assert.Contains("no stored run is of product &#39;CTP-99&#39;", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Yield_ProductOfTwoSequences_OffersEachKeepingTheOtherFilters()
    {
        await PageHost.WriteAsync(_host.StationB, [new TestSupport.Builders.RunRecordBuilder().WithSerial("CTP40A-2612-200001").WithStation("ST-02")
            .WithSequence("ctp40a-dac", 1).StartedAt(PageHost.Now.AddHours(-1)).Build()]);

        var (status, html, _) = await _host.SendAsync("/yield?product=CTP-40A&lot=LOT-2025-031");
        var (chosen, chosenHtml, _) = await _host.SendAsync("/yield?product=CTP-40A&lot=LOT-2025-031&sequence=ctp40a-dac");

        Assert.Equal(HttpStatusCode.BadRequest, status);
        Assert.Contains("product &#39;CTP-40A&#39; was tested by sequences ctp40a-dac, ctp40a-eol: choose one", html, StringComparison.Ordinal);
        Assert.Contains("href=\"/yield?product=CTP-40A&amp;lot=LOT-2025-031&amp;sequence=ctp40a-dac\"", html, StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.OK, chosen);
        Assert.Contains("<th scope=\"row\">Runs</th><td>1</td>", chosenHtml, StringComparison.Ordinal);
    }

    [Fact]
    public async Task CapabilityReading_SameFiguresAsTheReportBuilder()
    {
        var (status, html, _) = await _host.SendAsync("/capability/reading?product=CTP-40A&reading=verify.error");

        // The report over the same folders, loaded and built as 'linetest report' does: one computation.
        var query = new ReportQuery { SequenceId = "ctp40a-eol", ReadingNames = ["verify.error"] };
        var data = await ResultsLoader.LoadAsync([_host.StationA, _host.StationB], query);
        var expected = ReportBuilder.Build(data, query, new FakeTimeProvider(PageHost.Now)).Readings.Single();
        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains("<th scope=\"row\">Cpk</th><td>" + NumberText.Index(expected.Capability.Cpk), html, StringComparison.Ordinal);
        Assert.Contains("<th scope=\"row\">Mean</th><td>" + NumberText.Value(expected.Capability.Mean) + "</td>", html, StringComparison.Ordinal);
        Assert.Contains("<th scope=\"row\">n</th><td>" + expected.Count, html, StringComparison.Ordinal);
        Assert.Contains("src=\"/capability/histogram.svg?product=CTP-40A&amp;reading=verify.error\"", html, StringComparison.Ordinal);
        Assert.Contains("<h2>Signals</h2>", html, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("/capability/histogram.svg?reading=verify.error")]
    [InlineData("/capability/individuals.svg?reading=verify.error")]
    [InlineData("/yield/pareto.svg")]
    public async Task Charts_AreSvgDrawnHere(string path)
    {
        var (status, svg, headers) = await _host.SendAsync(path);

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.StartsWith("image/svg+xml", headers.ContentType.ToString(), StringComparison.Ordinal);
        Assert.Contains("<svg", svg, StringComparison.Ordinal);
        Assert.Contains("<text", svg, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Capability_Overview_LinksEveryReading()
    {
        var (status, html, _) = await _host.SendAsync("/capability?lot=L-A");

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains("href=\"/capability/reading?lot=L-A&amp;reading=verify.error\"", html, StringComparison.Ordinal);
        Assert.Contains("href=\"/capability/reading?lot=L-A&amp;reading=supply.current\"", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Units_Prefix_ListsMatchingSerialsFromBothStations()
    {
        var (status, html, _) = await _host.SendAsync("/units?serial=CTP40A-2612-00001");
        var (_, both, _) = await _host.SendAsync("/units?serial=CTP40A-2612-");

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains("href=\"/units/CTP40A-2612-000010\"", html, StringComparison.Ordinal);
        Assert.Contains("href=\"/units/CTP40A-2612-000019\"", html, StringComparison.Ordinal);
        Assert.DoesNotContain("CTP40A-2612-000020", html, StringComparison.Ordinal);
        Assert.Contains("10 serials", html, StringComparison.Ordinal);
        Assert.Contains("25 serials", both, StringComparison.Ordinal);
        Assert.Contains("href=\"/units/CTP40A-2612-100003\"", both, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Units_ExactSerial_RedirectsToItsHistory()
    {
        var (status, _, headers) = await _host.SendAsync("/units?serial=CTP40A-2612-000007");

        Assert.Equal(HttpStatusCode.Redirect, status);
        Assert.Equal("/units/CTP40A-2612-000007", headers.Location.ToString());
    }

    [Fact]
    public async Task UnitHistory_RetestedUnit_EveryRunWithReadingsLimitsUncertaintyAndRecordHash()
    {
        var (status, html, _) = await _host.SendAsync("/units/CTP40A-2612-000007");
        var history = await Storage.Sqlite.SqliteResultReader.InDirectory(_host.StationA).ReadHistoryAsync("CTP40A-2612-000007");

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Equal(2, history.Count);
        Assert.Contains("Run 1: <span class=\"verdict fail\">fail</span>", html, StringComparison.Ordinal);
        Assert.Contains("Run 2: <span class=\"verdict pass\">pass</span>", html, StringComparison.Ordinal);
        Assert.True(html.IndexOf(history[0].RecordSha256, StringComparison.Ordinal) < html.IndexOf(history[1].RecordSha256, StringComparison.Ordinal));
        Assert.Contains("<td class=\"n\">-0.2 … 0.2</td><td>guarded</td><td class=\"n\">0.05 (k=2)</td>", html, StringComparison.Ordinal);
        Assert.Contains("<td class=\"n\">0.4</td><td>degC</td><td class=\"n\">-0.25</td><td class=\"n\">0.25</td>", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task UnitHistory_UnknownSerial_404SayingSo()
    {
        var (status, html, _) = await _host.SendAsync("/units/NOPE-1");

        Assert.Equal(HttpStatusCode.NotFound, status);
        Assert.Contains("No stored run of unit NOPE-1.", html, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("/")]
    [InlineData("/yield")]
    [InlineData("/capability")]
    [InlineData("/capability/reading?reading=verify.error")]
    [InlineData("/units?serial=CTP")]
    [InlineData("/units/CTP40A-2612-000007")]
    public async Task Pages_UseOnlyAssetsOfThisProgram(string path)
    {
        var (status, html, headers) = await _host.SendAsync(path);

        Assert.Equal(HttpStatusCode.OK, status);
        foreach (Match m in AssetReference().Matches(html))
        {
            Assert.StartsWith("/", m.Groups[1].Value, StringComparison.Ordinal);
            Assert.False(m.Groups[1].Value.StartsWith("//", StringComparison.Ordinal), m.Value);
        }

        Assert.Contains("default-src 'self'", headers.ContentSecurityPolicy.ToString(), StringComparison.Ordinal);
        Assert.Contains("href=\"/assets/site.css\"", html, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("/assets/site.css", "text/css", "@media print")]
    [InlineData("/assets/line.js", "text/javascript", "EventSource(\"/line/events\")")]
    public async Task Assets_ServedFromTheProgram(string path, string type, string part)
    {
        var (status, body, headers) = await _host.SendAsync(path);

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.StartsWith(type, headers.ContentType.ToString(), StringComparison.Ordinal);
        Assert.Contains(part, body, StringComparison.Ordinal);
        Assert.DoesNotContain("http", body, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("POST")]
    [InlineData("DELETE")]
    [InlineData("PUT")]
    public async Task WritingMethods_Refused405(string method)
    {
        var (status, _, headers) = await _host.SendAsync("/units/CTP40A-2612-000007", method: method);

        Assert.Equal(HttpStatusCode.MethodNotAllowed, status);
        Assert.Equal("GET, HEAD", headers.Allow.ToString());
    }

    private static string Tile(string html, string station)
    {
        var start = html.IndexOf($"data-station=\"{station}\"", StringComparison.Ordinal);
        Assert.True(start >= 0, $"no tile for {station}");
        var end = html.IndexOf("</section>", start, StringComparison.Ordinal);
        return html[start..end];
    }

    private static string Figure(string tile, string key)
    {
        var m = Regex.Match(tile, $"data-key=\"{key}\">([^<]*)<");
        Assert.True(m.Success, $"no {key} in tile");
        return m.Groups[1].Value;
    }

    [GeneratedRegex("(?:src|href)=\"([^\"#]*)\"")]
    private static partial Regex AssetReference();
}
