using CsCheck;
using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Filters;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class RunFilterTests
{
    private static RunFilter ToRunFilter(FilterCase f) => new()
    {
        FromUtc = f.FromUtc,
        ToUtc = f.ToUtc,
        Station = f.Station,
        Slot = f.Slot,
        Lot = f.Lot,
        SequenceId = f.SequenceId,
        SequenceRevision = f.SequenceRevision,
        Serial = f.Serial,
    };

    private static string Describe(FilterCase f, IEnumerable<RunRecord> runs) =>
        $"{f} over {string.Join("; ", runs.Select(r => $"{r.Serial} {r.Station} slot {r.Slot} lot {r.Lot ?? "-"} {r.SequenceId} r{r.SequenceRevision} ended {r.EndedUtc.UtcTicks}"))}";

    // The C# predicate (for readings CSV files) and the SQL the database reports use must select the same runs for every
    // filter: station, slot, lot, sequence (product) and revision, serial, the date range with its inclusive start and
    // exclusive end to the tick, and any combination of them.
    [Fact]
    public async Task MatchesAndSql_AnyRunsAnyFilters_SelectTheSameRuns()
    {
        await Gen.Select(FilterCases.Run.Array[1, 24], FilterCases.Filter.Array[1, 10]).SampleAsync(
            async (runs, filters) =>
            {
                var folder = Some.TempDirectory();
                await using (var store = SqliteResultStore.Open(folder))
                {
                    foreach (var run in runs)
                    {
                        await store.AppendAsync(run, CancellationToken.None);
                    }
                }

                var reader = SqliteResultReader.InDirectory(folder);
                foreach (var f in filters)
                {
                    var filter = ToRunFilter(f);
                    var predicate = runs.Where(r => filter.Matches(r.EndedUtc, r.Station, r.Slot, r.Lot, r.SequenceId, r.SequenceRevision, r.Serial)).Select(r => r.Id).Order().ToList();
                    var expected = runs.Where(f.Expects).Select(r => r.Id).Order().ToList();
                    var sql = new List<Guid>();
                    await foreach (var summary in reader.ReadRunsAsync(filter))
                    {
                        sql.Add(summary.Id);
                    }

                    var forReports = new List<Guid>();
                    await foreach (var summary in reader.ReadRunsForReportAsync(filter))
                    {
                        forReports.Add(summary.Id);
                    }

                    Assert.True(expected.SequenceEqual(predicate), "C# predicate: " + Describe(f, runs));
                    Assert.True(expected.SequenceEqual(sql.Order()), "SQL (runs): " + Describe(f, runs));
                    Assert.True(expected.SequenceEqual(forReports.Order()), "SQL (report runs): " + Describe(f, runs));
                    Assert.Equal(expected.Count, await reader.CountRunsAsync(filter));
                }

                Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
                Directory.Delete(folder, recursive: true);
            },
            iter: 60,
            threads: 1);
    }
}
