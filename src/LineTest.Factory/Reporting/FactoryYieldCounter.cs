using LineTest.Core.Results;
using LineTest.Core.Statistics;
using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Counts the yield of a report's runs in SQL: one window over the runs by serial in run order finds each unit's first
/// and last run (earliest end first, equal ends in run order, the rule of <see cref="YieldAnalysis"/>), and one
/// <c>GROUP BY GROUPING SETS</c> counts runs by verdict and failure, units, and units passed first and last time, per
/// day of the unit's first run and per group of the report's grouping. Only a few hundred rows leave the server.
/// </summary>
/// <remarks>
/// The window is one sort and one pass: the last run is the one with no next row (<c>lead</c>), not a second window
/// counting the unit's runs, and serials are compared bytewise (<c>COLLATE "C"</c>: grouping by equal serials is the
/// same under any deterministic collation, and the database's own collation sorts several times slower). On a million
/// runs this took the server's processor time for the count from 2.8 s to 1.7–1.9 s (docs/benchmarks.md).
/// </remarks>
internal static class FactoryYieldCounter
{
    private const long TicksPerDay = TimeSpan.TicksPerDay;
    private const long TicksPerMinute = TimeSpan.TicksPerMinute;

    /// <summary>The SQL run order, for an alias.</summary>
    public static string RunOrder(string alias) =>
        $"{alias}.ended_ticks, {alias}.station, {alias}.chain_id, {alias}.station_seq";

    /// <summary>Counts the runs matching <paramref name="query"/> into a tally.</summary>
    public static async Task<YieldTally> CountAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction) { CommandTimeout = 0 };
        var where = FactoryFilterSql.Where(query, "r", command, runConditions: true);
        var groupColumns = GroupColumns(query.GroupBy);
        var firstValues = string.Concat(groupColumns.Select((c, i) => $", first_value({c}) OVER w AS g{i}"));
        var groupNames = string.Join(", ", groupColumns.Select((_, i) => $"g{i}"));
        var sets = groupColumns.Count == 0 ? "(u_day, verdict, why)" : $"(u_day, verdict, why), ({groupNames}, verdict, why)";
        var selectGroups = string.Concat(groupColumns.Select((_, i) => $", g{i}"));
        command.CommandText = $"""
            WITH x AS (
                SELECT r.verdict,
                       CASE r.verdict WHEN 'fail' THEN r.first_failing_reading WHEN 'error' THEN r.reason END AS why,
                       row_number() OVER w AS k,
                       lead(true, 1, false) OVER w AS later,
                       first_value(r.ended_ticks / {TicksPerDay}) OVER w AS u_day{firstValues}
                  FROM runs r{where}
                WINDOW w AS (PARTITION BY r.serial COLLATE "C" ORDER BY {RunOrder("r")})
            )
            SELECT GROUPING(u_day) AS by_group, u_day{selectGroups}, verdict, why,
                   count(*) AS runs,
                   count(*) FILTER (WHERE k = 1) AS units,
                   count(*) FILTER (WHERE k = 1 AND verdict = 'pass') AS first_passed,
                   count(*) FILTER (WHERE NOT later AND verdict = 'pass') AS last_passed
              FROM x
             GROUP BY GROUPING SETS ({sets});
            """;
        var tally = new YieldTally();

        // A row counts the runs of one verdict and failure; a unit's first and last run may fall in different rows,
        // so units are summed per group first and added once the group is complete.
        var units = new Dictionary<YieldCounts, (int Units, int FirstPassed, int LastPassed)>(ReferenceEqualityComparer.Instance);
        void Add(YieldCounts counts, Verdict verdict, string? why, int runs, int unitCount, int firstPassed, int lastPassed)
        {
            counts.AddRuns(verdict, why, runs);
            var sum = units.GetValueOrDefault(counts);
            units[counts] = (sum.Units + unitCount, sum.FirstPassed + firstPassed, sum.LastPassed + lastPassed);
        }

        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var byGroup = reader.GetInt32(0) != 0;
            var column = 2 + groupColumns.Count;
            var verdict = ParseVerdict(reader.GetString(column));
            var why = reader.IsDBNull(column + 1) ? null : reader.GetString(column + 1);
            var runs = checked((int)reader.GetInt64(column + 2));
            var unitCount = checked((int)reader.GetInt64(column + 3));
            var firstPassed = checked((int)reader.GetInt64(column + 4));
            var lastPassed = checked((int)reader.GetInt64(column + 5));
            if (byGroup)
            {
                Add(tally.Group(GroupKey(reader, query)), verdict, why, runs, unitCount, firstPassed, lastPassed);
                continue;
            }

            // Every unit has exactly one first-run day, so the days add up to the whole.
            var day = new DateTimeOffset(reader.GetInt64(1) * TicksPerDay, TimeSpan.Zero);
            Add(tally.Day(RunTable.GroupKeyOf(ReportGrouping.Day, string.Empty, 0, null, day, null, null, null)), verdict, why, runs, unitCount, firstPassed, lastPassed);
            Add(tally.Overall, verdict, why, runs, unitCount, firstPassed, lastPassed);

            // The first runs alone: each unit once, its first run being also its last.
            Add(tally.FirstRuns, verdict, why, unitCount, unitCount, firstPassed, firstPassed);
        }

        foreach (var (counts, sum) in units)
        {
            counts.AddUnits(sum.Units, sum.FirstPassed, sum.LastPassed);
        }

        if (query.GroupBy == ReportGrouping.Day)
        {
            foreach (var (key, counts) in tally.Days)
            {
                tally.Group(key).Add(counts);
            }
        }

        return tally;
    }

    /// <summary>The columns of the unit's first run that name its group (the day is always counted).</summary>
    private static List<string> GroupColumns(ReportGrouping grouping) => grouping switch
    {
        ReportGrouping.None or ReportGrouping.Day => [],
        ReportGrouping.Station => ["r.station"],
        ReportGrouping.Slot => ["r.slot"],
        ReportGrouping.Lot => ["r.lot"],
        ReportGrouping.Revision => ["r.sequence_id", "r.sequence_revision"],
        ReportGrouping.Operator => ["r.operator"],
        // Shifts start on whole minutes, so the minute of the day decides the shift.
        ReportGrouping.Shift => [$"(r.ended_ticks / {TicksPerMinute}) % 1440"],
        _ => throw new ArgumentOutOfRangeException(nameof(grouping), grouping, "Unknown grouping."),
    };

    private static string GroupKey(NpgsqlDataReader reader, ReportQuery query)
    {
        string? Text(int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetString(ordinal);
        return query.GroupBy switch
        {
            ReportGrouping.Station => RunTable.GroupKeyOf(query.GroupBy, Text(2)!, 0, null, null, null, null, null),
            ReportGrouping.Slot => RunTable.GroupKeyOf(query.GroupBy, string.Empty, reader.GetInt32(2), null, null, null, null, null),
            ReportGrouping.Lot => RunTable.GroupKeyOf(query.GroupBy, string.Empty, 0, Text(2), null, null, null, null),
            ReportGrouping.Revision => RunTable.GroupKeyOf(query.GroupBy, string.Empty, 0, null, null, Text(2), reader.GetInt32(3), null),
            ReportGrouping.Operator => RunTable.GroupKeyOf(query.GroupBy, string.Empty, 0, null, null, null, null, Text(2)),
            ReportGrouping.Shift => RunTable.GroupKeyOf(
                query.GroupBy, string.Empty, 0, null, new DateTimeOffset(reader.GetInt64(2) * TicksPerMinute, TimeSpan.Zero), null, null, null, query.Shifts),
            _ => throw new InvalidOperationException($"Grouping {query.GroupBy} has no group columns."),
        };
    }

    internal static Verdict ParseVerdict(string word) => word switch
    {
        "pass" => Verdict.Pass,
        "fail" => Verdict.Fail,
        "error" => Verdict.Error,
        _ => throw new InvalidDataException($"Column verdict holds '{word}', which is not pass, fail or error."),
    };
}
