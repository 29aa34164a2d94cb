using LineTest.Factory.Reporting;
using LineTest.Factory.Tests.Support;
using LineTest.Reports.Building;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Factory.Tests.Reporting;

public sealed class FactoryReportLoaderTests
{
    private static readonly DateTimeOffset Start = new(2026, 4, 30, 18, 0, 0, TimeSpan.Zero);

    public static TheoryData<string, ReportQuery> Queries => new()
    {
        { "all runs", ReportQuery.All },
        { "by station", new ReportQuery { GroupBy = ReportGrouping.Station } },
        { "by day across a month end", new ReportQuery { GroupBy = ReportGrouping.Day } },
        { "lot and slot filter", new ReportQuery { Lot = "LOT-A", Slot = 2, GroupBy = ReportGrouping.Lot } },
        { "one station, time window, two readings", new ReportQuery
            {
                Station = "ST-02",
                FromUtc = Start.AddHours(3),
                ToUtc = Start.AddHours(20),
                ReadingNames = ["verify.error", "trim.offset"],
                GroupBy = ReportGrouping.Slot,
            }
        },
    };

    public static TheoryData<string, ReportQuery> RetestQueries => new()
    {
        { "all runs", ReportQuery.All },
        { "first runs only", new ReportQuery { FirstRunsOnly = true } },
        { "by station, first runs only", new ReportQuery { GroupBy = ReportGrouping.Station, FirstRunsOnly = true } },
        { "by day", new ReportQuery { GroupBy = ReportGrouping.Day } },
        { "by shift", new ReportQuery { GroupBy = ReportGrouping.Shift } },
        { "by named shifts", new ReportQuery { GroupBy = ReportGrouping.Shift, Shifts = new NamedShifts([("day", new TimeOnly(7, 30)), ("evening", new TimeOnly(19, 10))]) } },
        { "by revision", new ReportQuery { GroupBy = ReportGrouping.Revision } },
        { "by operator", new ReportQuery { GroupBy = ReportGrouping.Operator } },
        { "by lot, slot filter", new ReportQuery { Slot = 3, GroupBy = ReportGrouping.Lot } },
        { "by slot, revision filter, time window", new ReportQuery { SequenceRevision = 3, FromUtc = Start.AddHours(2), ToUtc = Start.AddHours(9), GroupBy = ReportGrouping.Slot } },
    };

    [PostgresTheory]
    [MemberData(nameof(Queries))]
    public async Task LoadAsync_SameRunsAsTheStationFolders_SameJsonReport(string what, ReportQuery query) =>
        await AssertSameReportsAsync(what, query, retests: false, apart: TimeSpan.FromMinutes(7));

    /// <summary>
    /// Units tested twice in a row at each of three stations whose runs end at the same instants: each unit's first and
    /// last run are decided by the end time and then the run order, the same in SQL as in the report builder.
    /// </summary>
    [PostgresTheory]
    [MemberData(nameof(RetestQueries))]
    public async Task LoadCountedAsync_RetestsAtThreeStationsEndingTogether_SameJsonReportAsFolders(string what, ReportQuery query) =>
        await AssertSameReportsAsync(what, query, retests: true, apart: TimeSpan.Zero);

    [PostgresTheory]
    [MemberData(nameof(RetestQueries))]
    public async Task LoadCountedAsync_RetestsAtStationsMinutesApart_SameJsonReportAsFolders(string what, ReportQuery query) =>
        await AssertSameReportsAsync(what, query, retests: true, apart: TimeSpan.FromMinutes(7));

    [PostgresFact]
    public async Task LoadCountedAsync_YieldCountedInSql_RunsLoadedWithoutOutcomes()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var station = new StationFolder("ST-01", Start);
        await station.AddRunsAsync(12, retests: true);
        await Support.Factory.ForwardAsync(Support.Factory.Forwarder(database), station.Directory);

        var data = await FactoryReportLoader.LoadCountedAsync(database.DataSource, new ReportQuery { FirstRunsOnly = true });

        Assert.False(data.Runs.HasOutcomes);
        Assert.NotNull(data.Tally);
        // 12 runs of 6 units [derived: serials (n + 1) / 2 for n = 1..12].
        Assert.Equal(12, data.Tally.Overall.Runs);
        Assert.Equal(6, data.Tally.Overall.Units);
        Assert.Equal([true, false, true, false, true, false, true, false, true, false, true, false], data.Tally.FirstRunFlags!);
    }

    private static async Task AssertSameReportsAsync(string what, ReportQuery query, bool retests, TimeSpan apart)
    {
        await using var database = await TestDatabase.CreateAsync();
        var stations = new[] { "ST-01", "ST-02", "ST-03" }.Select((s, i) => new StationFolder(s, Start + (i * apart))).ToList();
        try
        {
            var forwarder = Support.Factory.Forwarder(database);
            foreach (var station in stations)
            {
                await station.AddRunsAsync(40, retests: retests);
                await Support.Factory.ForwardAsync(forwarder, station.Directory);
            }

            // Folders listed in station order: a folder report orders merged stations by end time, then by folder.
            var fromFolders = await ResultsLoader.LoadAsync(stations.Select(s => s.Directory).ToList(), query);
            var fromFactory = await FactoryReportLoader.LoadAsync(database.DataSource, query);
            var counted = await FactoryReportLoader.LoadCountedAsync(database.DataSource, query);
            var times = new FactoryLoadTimes();
            var packed = await FactoryReportLoader.LoadPackedAsync(database.DataSource, query, times);

            Assert.True(fromFolders.Runs.Count > 0, what);
            Assert.True(times.FromPacks, what);
            var expected = Json(fromFolders, query);
            Assert.Equal(expected, Json(fromFactory, query));
            Assert.Equal(expected, Json(counted, query));
            Assert.Equal(expected, Json(packed, query));
        }
        finally
        {
            foreach (var station in stations)
            {
                await station.DisposeAsync();
            }
        }
    }

    [PostgresFact]
    public async Task LoadAsync_SameEndInstantAtTwoStations_OrderedByStationLikeFolders()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var a = new StationFolder("ST-01", Start);
        await using var b = new StationFolder("ST-02", Start);
        await a.AddRunsAsync(6);
        await b.AddRunsAsync(6);
        var forwarder = Support.Factory.Forwarder(database);
        await Support.Factory.ForwardAsync(forwarder, b.Directory);
        await Support.Factory.ForwardAsync(forwarder, a.Directory);

        var fromFactory = await FactoryReportLoader.LoadAsync(database.DataSource, ReportQuery.All);

        Assert.Equal(
            Enumerable.Range(0, 6).SelectMany(i => new[] { a.Stored[i].Serial, b.Stored[i].Serial }),
            Enumerable.Range(0, fromFactory.Runs.Count).Select(fromFactory.Runs.Serial));
    }

    private static string Json(ReportData data, ReportQuery query)
    {
        // The sources are where the data came from (paths or the server), the one intended difference.
        var report = ReportBuilder.Build(data, query, new FakeTimeProvider(new DateTimeOffset(2026, 5, 2, 8, 0, 0, TimeSpan.Zero))) with { Sources = [] };
        return ReportJsonWriter.ToJson(report);
    }
}
