using LineTest.Factory.Reporting;
using LineTest.Factory.Reporting.Packs;
using LineTest.Factory.Tests.Support;
using LineTest.Reports.Building;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using Microsoft.Extensions.Time.Testing;
using Npgsql;

namespace LineTest.Factory.Tests.Reporting.Packs;

/// <summary>
/// Reports read from the packs of runs against the same runs read from the station folders: the packs are derived data,
/// so every way they can fall behind or be missing must still give the folders' report.
/// </summary>
public sealed class PackedReportLoaderTests
{
    // Runs 20 minutes apart from the evening of 30 April: a station's 40 runs end in April and in May.
    private static readonly DateTimeOffset Start = new(2026, 4, 30, 18, 0, 0, TimeSpan.Zero);

    [PostgresFact]
    public async Task LoadPackedAsync_MoreRunsForwardedAfterAReport_OnlyTheirMonthsPackedAgainAndTheReportStillTheFolders()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(3);
        var forwarder = Support.Factory.Forwarder(database);
        await stations.AddAndForwardAsync(forwarder, 40);
        var first = new FactoryLoadTimes();
        var told = new List<long>();
        await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, first, told.Add);

        // 5 more runs per station, all in May: only May's pack of each station is written again.
        await stations.AddAndForwardAsync(forwarder, 5);
        var second = new FactoryLoadTimes();
        var packed = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, second, told.Add);
        await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, building: told.Add);

        // Told before each build how many runs came since (3 stations × 40, then 3 × 5), and not when nothing came.
        Assert.Equal([120L, 15L], told);
        Assert.True(first.FromPacks);
        Assert.Equal(6, first.PacksWritten);
        Assert.True(second.FromPacks);
        Assert.Equal(3, second.PacksWritten);
        Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(packed, ReportQuery.All));
    }

    [PostgresFact]
    public async Task TryLoadAsync_RunsForwardedAfterThePacksWereBuilt_RefusesSoNoRunIsLeftOut()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        var forwarder = Support.Factory.Forwarder(database);
        await stations.AddAndForwardAsync(forwarder, 6);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);
        await stations.AddAndForwardAsync(forwarder, 1);

        var stale = await PackedReportLoader.TryLoadAsync(database.DataSource, ReportQuery.All, null, 0, CancellationToken.None);
        var loaded = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All);

        Assert.Null(stale);
        Assert.Equal(14, loaded.Runs.Count);
        Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(loaded, ReportQuery.All));
    }

    [PostgresFact]
    public async Task LoadPackedAsync_DatabaseOfSchemaVersionOne_ReadsTheRowsAndGivesTheSameReport()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        await stations.AddAndForwardAsync(Support.Factory.Forwarder(database), 10);
        await database.ExecuteAsync("DROP TABLE run_packs; DROP TABLE run_pack_marks; DELETE FROM schema_migrations WHERE version = 2;");

        var times = new FactoryLoadTimes();
        var data = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, times);

        Assert.False(times.FromPacks);
        Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(data, ReportQuery.All));
    }

    [PostgresFact]
    public async Task LoadPackedAsync_ReadOnlyLogin_CurrentPacksReadAndStalePacksLeftForTheRows()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        var forwarder = Support.Factory.Forwarder(database);
        await stations.AddAndForwardAsync(forwarder, 8);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);
        var role = "ro_" + database.Name;
        await database.ExecuteAsync($"CREATE ROLE {role} LOGIN; GRANT SELECT ON ALL TABLES IN SCHEMA public TO {role};");
        try
        {
            await using var readOnly = LineTest.Factory.Schema.FactoryConnection.Create(new NpgsqlConnectionStringBuilder(database.ConnectionString) { Username = role }.ConnectionString);

            var current = new FactoryLoadTimes();
            var fromPacks = await FactoryReportLoader.LoadPackedAsync(readOnly, ReportQuery.All, current);
            await stations.AddAndForwardAsync(forwarder, 2);
            var behind = new FactoryLoadTimes();
            var fromRows = await FactoryReportLoader.LoadPackedAsync(readOnly, ReportQuery.All, behind);

            Assert.True(current.FromPacks);
            Assert.Equal(16, fromPacks.Runs.Count);
            Assert.False(behind.FromPacks);
            Assert.Equal(20, fromRows.Runs.Count);
            Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(fromRows, ReportQuery.All));
        }
        finally
        {
            NpgsqlConnection.ClearAllPools();
            await database.ExecuteAsync($"REVOKE ALL ON ALL TABLES IN SCHEMA public FROM {role}; DROP ROLE {role};");
        }
    }

    [PostgresFact]
    public async Task LoadPackedAsync_AMonthArchived_ItsPacksLeftOutAsTheRowsLeaveItOut()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        await stations.AddAndForwardAsync(Support.Factory.Forwarder(database), 25);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);

        // Retention as docs/factory.md describes it, without deleting the packs: April leaves as whole partitions.
        await database.ExecuteAsync("""
            ALTER TABLE runs DETACH PARTITION runs_2026m04; ALTER TABLE readings DETACH PARTITION readings_2026m04;
            DROP TABLE runs_2026m04; DROP TABLE readings_2026m04;
            """);
        var times = new FactoryLoadTimes();
        var packed = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, times);
        var rows = await FactoryReportLoader.LoadAsync(database.DataSource, ReportQuery.All);

        Assert.True(times.FromPacks);
        Assert.True(rows.Runs.Count is > 0 and < 50);
        Assert.Equal(Json(rows, ReportQuery.All), Json(packed, ReportQuery.All));
    }

    [PostgresFact]
    public async Task LoadPackedAsync_PacksOfAnotherFormat_BuiltAgainNotMisread()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        await stations.AddAndForwardAsync(Support.Factory.Forwarder(database), 10);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);
        await database.ExecuteAsync("UPDATE run_packs SET format = 99, body = '\\x00'::bytea;");

        var times = new FactoryLoadTimes();
        var data = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, times);

        Assert.True(times.FromPacks);
        Assert.Equal(await database.ScalarAsync<long>("SELECT count(*) FROM run_packs;"), times.PacksWritten);
        Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(data, ReportQuery.All));
    }

    [PostgresTheory]
    [InlineData(0)]
    [InlineData(-5)]
    [InlineData(1)]
    [InlineData(int.MaxValue)]
    public async Task LoadPackedAsync_RunCountOfThePacksWrong_OnlyAHintSoTheReportIsTheFolders(int runs)
    {
        // run_packs.runs sizes the run table; edited on the server to nothing, less than nothing, too few or far too many,
        // the packs are still read whole and the report is the folders'.
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(2);
        await stations.AddAndForwardAsync(Support.Factory.Forwarder(database), 12);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);
        await database.ExecuteAsync($"UPDATE run_packs SET runs = {runs};");

        var times = new FactoryLoadTimes();
        var data = await FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All, times);

        Assert.True(times.FromPacks);
        Assert.Equal(0, times.PacksWritten);
        Assert.Equal(await stations.FolderJsonAsync(ReportQuery.All), Json(data, ReportQuery.All));
    }

    [PostgresFact]
    public async Task LoadPackedAsync_PackDamagedOnTheServer_ErrorNamesThePackAndHowToRebuildIt()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var stations = await Stations.CreateAsync(1);
        await stations.AddAndForwardAsync(Support.Factory.Forwarder(database), 4);
        await FactoryReportLoader.BuildPacksAsync(database.DataSource);
        await database.ExecuteAsync("UPDATE run_packs SET body = substring(body from 1 for 40);");

        var error = await Assert.ThrowsAsync<InvalidDataException>(() => FactoryReportLoader.LoadPackedAsync(database.DataSource, ReportQuery.All));

        Assert.Contains("cannot be read: The run pack", error.Message, StringComparison.Ordinal);
        Assert.Contains("DELETE FROM run_packs WHERE chain_id", error.Message, StringComparison.Ordinal);
    }

    private static string Json(ReportData data, ReportQuery query)
    {
        // The sources are where the data came from (paths or the server), the one intended difference.
        var report = ReportBuilder.Build(data, query, new FakeTimeProvider(new DateTimeOffset(2026, 5, 2, 8, 0, 0, TimeSpan.Zero))) with { Sources = [] };
        return ReportJsonWriter.ToJson(report);
    }

    /// <summary>Station folders that forward to the test's database.</summary>
    private sealed class Stations : IAsyncDisposable
    {
        private readonly List<StationFolder> _folders;

        private Stations(List<StationFolder> folders) => _folders = folders;

        public static Task<Stations> CreateAsync(int count) =>
            Task.FromResult(new Stations([.. Enumerable.Range(1, count).Select(k => new StationFolder($"ST-{k:D2}", Start))]));

        public async Task AddAndForwardAsync(LineTest.Factory.Forwarding.FactoryForwarder forwarder, int runsEach)
        {
            foreach (var folder in _folders)
            {
                await folder.AddRunsAsync(runsEach, retests: true);
                await Support.Factory.ForwardAsync(forwarder, folder.Directory);
            }
        }

        public async Task<string> FolderJsonAsync(ReportQuery query) =>
            Json(await ResultsLoader.LoadAsync(_folders.Select(s => s.Directory).ToList(), query), query);

        public async ValueTask DisposeAsync()
        {
            foreach (var folder in _folders)
            {
                await folder.DisposeAsync();
            }
        }
    }
}
