using CsCheck;
using LineTest.Core.Results;
using LineTest.Factory.Reporting;
using LineTest.Factory.Tests.Support;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Filters;

namespace LineTest.Factory.Tests.Reporting;

public sealed class FactoryFilterSqlTests
{
    // The factory database's report filter (PostgreSQL, written from a report query) must select the same runs as the
    // C# predicate of the station's RunFilter (which the SQLite filter is checked against in LineTest.Storage.Tests):
    // station, slot, lot, sequence (product) and revision, and the date range to the tick, in any combination. The
    // query has no serial condition, so the cases have none. One database for all samples; each sample's runs are told
    // apart by their run ids.
    [PostgresFact]
    public async Task Where_AnyRunsAnyFilters_SameRunsAsTheRunFilterPredicate_WithParametersAndWithLiterals()
    {
        await using var database = await TestDatabase.CreateAsync();
        var forwarder = Support.Factory.Forwarder(database);
        await Gen.Select(FilterCases.Run.Array[1, 24], FilterCases.Filter.Array[1, 10]).SampleAsync(
            async (runs, filters) =>
            {
                foreach (var station in runs.GroupBy(r => r.Station))
                {
                    var folder = Some.TempDirectory();
                    await using (var store = SqliteResultStore.Open(folder))
                    {
                        foreach (var run in station)
                        {
                            await store.AppendAsync(run, CancellationToken.None);
                        }
                    }

                    await Support.Factory.ForwardAsync(forwarder, folder);
                }

                var ids = runs.Select(r => r.Id).ToHashSet();
                foreach (var f in filters.Select(f => f with { Serial = null }))
                {
                    var query = new ReportQuery
                    {
                        FromUtc = f.FromUtc, ToUtc = f.ToUtc, Station = f.Station, Slot = f.Slot, Lot = f.Lot, SequenceId = f.SequenceId, SequenceRevision = f.SequenceRevision,
                    };
                    var filter = query.ToRunFilter();
                    var predicate = runs.Where(r => filter.Matches(r.EndedUtc, r.Station, r.Slot, r.Lot, r.SequenceId, r.SequenceRevision, r.Serial)).Select(r => r.Id).Order().ToList();

                    await using var command = database.DataSource.CreateCommand();
                    command.CommandText = "SELECT r.run_id FROM runs r" + FactoryFilterSql.Where(query, "r", command, runConditions: true) + ";";
                    var sql = new List<Guid>();
                    await using (var reader = await command.ExecuteReaderAsync())
                    {
                        while (await reader.ReadAsync())
                        {
                            var id = reader.GetGuid(0);
                            if (ids.Contains(id))
                            {
                                sql.Add(id);
                            }
                        }
                    }

                    // The same conditions with the values written in as literals (for COPY, which takes no parameters).
                    var literal = new List<Guid>();
                    await using (var plain = database.DataSource.CreateCommand("SELECT r.run_id FROM runs r" + FactoryFilterSql.WhereLiteral(query, "r", runConditions: true) + ";"))
                    await using (var reader = await plain.ExecuteReaderAsync())
                    {
                        while (await reader.ReadAsync())
                        {
                            var id = reader.GetGuid(0);
                            if (ids.Contains(id))
                            {
                                literal.Add(id);
                            }
                        }
                    }

                    Assert.True(runs.Where(f.Expects).Select(r => r.Id).Order().SequenceEqual(predicate), $"C# predicate: {f}");
                    Assert.True(predicate.SequenceEqual(sql.Order()), $"factory SQL: {f} over {Describe(runs)}");
                    Assert.True(predicate.SequenceEqual(literal.Order()), $"factory SQL with literals: {f} over {Describe(runs)}");
                }
            },
            iter: 25,
            threads: 1);
    }

    private static string Describe(IEnumerable<RunRecord> runs) =>
        string.Join("; ", runs.Select(r => $"{r.Serial} {r.Station} slot {r.Slot} lot {r.Lot ?? "-"} {r.SequenceId} r{r.SequenceRevision} ended {r.EndedUtc.UtcTicks}"));
}
