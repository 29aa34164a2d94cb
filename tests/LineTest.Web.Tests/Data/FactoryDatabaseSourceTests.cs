using System.Net;
using System.Text.RegularExpressions;
using LineTest.Factory.Forwarding;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport.Builders;
using LineTest.Web.Data;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Web.Tests.Data;

/// <summary>
/// The page over the factory database (<c>serve --factory</c>) against a real PostgreSQL server: PageHost's two stations
/// forwarded there show the same figures as the page over their folders, and each tile says what the server holds.
/// </summary>
public sealed partial class FactoryDatabaseSourceTests : IAsyncLifetime
{
    private readonly string _database = "lt_web_" + Guid.NewGuid().ToString("N")[..12];
    private string _root = null!;
    private string _connection = null!;
    private PageHost? _folders;
    private PageHost? _factory;

    public async Task InitializeAsync()
    {
        if (TestPostgres.SkipReason is not null)
        {
            return;
        }

        _root = await PageHost.WriteStationsAsync();
        _connection = await TestPostgres.CreateDatabaseAsync(_database);
        await ForwardAsync(_connection, Path.Combine(_root, "st01"), Path.Combine(_root, "st02"));
        _folders = await PageHost.StartAsync(
            Directory.CreateTempSubdirectory("linetest-web-folders-").FullName, new SqliteFolderSource([Path.Combine(_root, "st01"), Path.Combine(_root, "st02")]));
        _factory = await PageHost.StartAsync(
            Directory.CreateTempSubdirectory("linetest-web-factory-").FullName, FactoryDatabaseSource.Create(_connection, new FakeTimeProvider(PageHost.Now)));
    }

    public async Task DisposeAsync()
    {
        if (_factory is not null)
        {
            await _factory.DisposeAsync();
            await ((IAsyncDisposable)_factory.Source.Inner).DisposeAsync();
            await _folders!.DisposeAsync();
            await TestPostgres.DropDatabaseAsync(_database);
            Directory.Delete(_root, recursive: true);
        }
    }

    [PostgresFact]
    public async Task Line_OneTilePerForwardingStation_SameShiftFiguresAsFromTheFolders()
    {
        var (status, html, _) = await _factory!.SendAsync("/");
        var (_, folderHtml, _) = await _folders!.SendAsync("/");

        Assert.Equal(HttpStatusCode.OK, status);
        foreach (var station in new[] { "ST-01", "ST-02" })
        {
            foreach (var key in new[] { "shift-runs", "shift-fpy", "today-fpy", "today-runs", "units-per-hour" })
            {
                Assert.NotEmpty(Figure(Tile(folderHtml, station), key));
                Assert.Equal(Figure(Tile(folderHtml, station), key), Figure(Tile(html, station), key));
            }
        }

        // [derived] PageHost: ST-01 stored 22 runs (seq 1…22), ST-02 5 runs; all forwarded, none refused.
        var st01 = Tile(html, "ST-01");
        Assert.Equal("22", Figure(st01, "factory-runs"));
        Assert.Equal("22", Figure(st01, "factory-head-seq"));
        Assert.Equal("5", Figure(Tile(html, "ST-02"), "factory-runs"));
        Assert.DoesNotContain("factory-refused", st01, StringComparison.Ordinal);
        Assert.Contains("last run received", st01, StringComparison.Ordinal);
        Assert.Contains("cannot be seen from here", st01, StringComparison.Ordinal);
    }

    [PostgresFact]
    public async Task Line_RunsStoredButNotForwarded_NotCountedUntilTheyArrive()
    {
        var st02 = Path.Combine(_root, "st02");
        await PageHost.WriteAsync(st02, [.. Enumerable.Range(1, 3).Select(i => new RunRecordBuilder().WithSerial($"CTP40A-2612-1001{i:D2}").WithStation("ST-02")
            .StartedAt(PageHost.Now.AddMinutes(-30 + i)).WithReadings(PageHost.Readings(0.01, PageHost.Now)).Build())]);

        var (_, before, _) = await _factory!.SendAsync("/");
        await ForwardAsync(_connection, st02);
        _factory.Clock.Advance(TimeSpan.FromSeconds(5)); // past the line page's shared look (half the refresh interval)
        var (_, after, _) = await _factory.SendAsync("/");

        Assert.Equal("5", Figure(Tile(before, "ST-02"), "factory-runs"));
        Assert.Equal("5", Figure(Tile(before, "ST-02"), "shift-runs"));
        Assert.Equal("8", Figure(Tile(after, "ST-02"), "factory-runs"));
        Assert.Equal("8", Figure(Tile(after, "ST-02"), "factory-head-seq"));
        Assert.Equal("8", Figure(Tile(after, "ST-02"), "shift-runs"));
    }

    [PostgresFact]
    public async Task YieldAndCapability_SamePagesAsFromTheFolders()
    {
        foreach (var path in new[] { "/yield", "/yield?station=ST-01&lot=L-A", "/capability", "/capability/reading?reading=verify.error" })
        {
            var (status, html, _) = await _factory!.SendAsync(path);
            var (_, folderHtml, _) = await _folders!.SendAsync(path);

            Assert.Equal(HttpStatusCode.OK, status);
            Assert.Contains("<table", MainOf(html), StringComparison.Ordinal);
            Assert.Equal(MainOf(folderHtml), MainOf(html));
        }

        // Yield reads the runs without their readings, within the default window, in SQL.
        var yieldLoad = _factory!.Source.Loads.First(l => !l.WithReadings);
        Assert.Equal(new DateTimeOffset(2026, 11, 27, 0, 0, 0, TimeSpan.Zero), yieldLoad.Query.FromUtc);
    }

    [PostgresFact]
    public async Task Units_SearchAndHistory_FromEveryStationWithTheStationsRecordHashes()
    {
        var (_, search, _) = await _factory!.SendAsync("/units?serial=CTP40A-2612-");
        var (status, history, _) = await _factory.SendAsync("/units/CTP40A-2612-000007");
        var held = await new SqliteResultReader(ResultsDatabase.PathIn(Path.Combine(_root, "st01"))).ReadHistoryAsync("CTP40A-2612-000007");

        Assert.Contains("25 serials", search, StringComparison.Ordinal);
        Assert.Contains("href=\"/units/CTP40A-2612-100003\"", search, StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Equal(2, held.Count);
        Assert.All(held, run => Assert.Contains(run.RecordSha256, history, StringComparison.Ordinal));
        Assert.Equal(MainOf((await _folders!.SendAsync("/units/CTP40A-2612-000007")).Body), MainOf(history));
    }

    [Fact]
    public async Task ServerUnreachable_TileAndPagesSayWhyWithoutThePassword()
    {
        // Port 1 on loopback: nothing listens, so the connection is refused at once.
        await using var source = FactoryDatabaseSource.Create("Host=127.0.0.1;Port=1;Username=station07;Password=s3cret-pw;Database=linetest;Timeout=3", TimeProvider.System);
        await using var host = await PageHost.StartAsync(Directory.CreateTempSubdirectory("linetest-web-down-").FullName, source);

        var (lineStatus, line, _) = await host.SendAsync("/");
        var (yieldStatus, yieldHtml, _) = await host.SendAsync("/yield");

        Assert.Equal(HttpStatusCode.OK, lineStatus);
        Assert.Contains("<section class=\"tile unreadable\" data-station=\"postgresql://127.0.0.1:1/linetest\">", line, StringComparison.Ordinal);
        Assert.Contains("cannot be read", line, StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.ServiceUnavailable, yieldStatus);
        Assert.Contains("The results could not be read: postgresql://127.0.0.1:1/linetest cannot be read", yieldHtml, StringComparison.Ordinal);
        Assert.DoesNotContain("s3cret-pw", line + yieldHtml, StringComparison.Ordinal);
    }

    private static async Task ForwardAsync(string connectionString, params string[] folders)
    {
        await using var dataSource = LineTest.Factory.Schema.FactoryConnection.Create(connectionString);
        var forwarder = new FactoryForwarder(dataSource, TimeProvider.System, NullLogger<FactoryForwarder>.Instance);
        foreach (var folder in folders)
        {
            await using var outbox = SqliteOutbox.Open(folder);
            await forwarder.ForwardAsync(outbox);
        }
    }

    private static string MainOf(string html) => MainPattern().Match(html).Value;

    private static string Tile(string html, string station) =>
        Regex.Match(html, "<section class=\"tile [a-z]+\" data-station=\"" + Regex.Escape(station) + "\">.*?</section>", RegexOptions.Singleline).Value;

    private static string Figure(string tile, string key) =>
        Regex.Match(tile, "data-key=\"" + Regex.Escape(key) + "\">([^<]*)<").Groups[1].Value;

    [GeneratedRegex("<main.*?</main>", RegexOptions.Singleline)]
    private static partial Regex MainPattern();
}
