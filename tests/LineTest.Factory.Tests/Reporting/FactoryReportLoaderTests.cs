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

    [PostgresTheory]
    [MemberData(nameof(Queries))]
    public async Task LoadAsync_SameRunsAsTheStationFolders_SameJsonReport(string what, ReportQuery query)
    {
        await using var database = await TestDatabase.CreateAsync();
        var stations = new[] { "ST-01", "ST-02", "ST-03" }.Select((s, i) => new StationFolder(s, Start.AddMinutes(i * 7))).ToList();
        try
        {
            var forwarder = Support.Factory.Forwarder(database);
            foreach (var station in stations)
            {
                await station.AddRunsAsync(40);
                await Support.Factory.ForwardAsync(forwarder, station.Directory);
            }

            // Folders listed in station order: a folder report orders merged stations by end time, then by folder.
            var fromFolders = await ResultsLoader.LoadAsync(stations.Select(s => s.Directory).ToList(), query);
            var fromFactory = await FactoryReportLoader.LoadAsync(database.DataSource, query);

            Assert.True(fromFolders.Runs.Count > 0, what);
            Assert.Equal(Json(fromFolders, query), Json(fromFactory, query));
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
