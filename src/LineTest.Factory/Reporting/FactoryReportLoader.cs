using LineTest.Factory.Schema;
using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Loads report data from the factory database, in the form <see cref="ResultsLoader"/> gives for station folders, so
/// the same <c>ReportBuilder</c> and writers make the same report. SQL does the filtering (partition pruning on the
/// month, indexes on station and lot) and the ordering; runs and readings are streamed in the factory's run order,
/// (end instant, station, station database, seq), which is the order a folder report puts merged stations in.
/// </summary>
public static class FactoryReportLoader
{
    /// <summary>
    /// Loads the runs (with their serials and outcomes) and readings matching <paramref name="query"/>; the report
    /// counts yield from the runs.
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static Task<ReportData> LoadAsync(NpgsqlDataSource dataSource, ReportQuery query, CancellationToken ct = default) =>
        LoadAsync(dataSource, query, countYield: false, ct);

    /// <summary>
    /// Loads the data for a report with the yield counted in SQL (<see cref="ReportData.Tally"/>: yield, first-pass
    /// yield and Pareto per group and day), and the runs without serials or outcomes: only what places each reading
    /// (time, station, slot, lot, sequence) and the reading values, which the statistics that SQL cannot do (moving
    /// ranges in run order, normality, percentiles) need one by one. The report is the same as from
    /// <see cref="LoadAsync(NpgsqlDataSource, ReportQuery, CancellationToken)"/>, with far less read.
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static Task<ReportData> LoadCountedAsync(NpgsqlDataSource dataSource, ReportQuery query, CancellationToken ct = default) =>
        LoadAsync(dataSource, query, countYield: true, ct);

    private static async Task<ReportData> LoadAsync(NpgsqlDataSource dataSource, ReportQuery query, bool countYield, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(query);
        var data = new ReportData();
        data.AddSource(FactoryConnection.Describe(dataSource));

        // Every scan in one repeatable-read snapshot: stations forwarding meanwhile do not make runs, readings and
        // counts disagree. Other connections import the snapshot, so the yield is counted while the runs stream, and
        // the months of readings stream on several connections at once; where a snapshot cannot be shared (a server
        // in recovery), everything runs on the one connection, one after the other.
        await using var session = await SharedSnapshot.OpenAsync(dataSource, ct).ConfigureAwait(false);
        Task<YieldTally>? counting = null;
        try
        {
            if (countYield && session.Shared)
            {
                counting = Task.Run(
                    async () =>
                    {
                        var (connection, transaction) = await session.JoinAsync(ct).ConfigureAwait(false);
                        return await FactoryYieldCounter.CountAsync(connection, transaction, query, ct).ConfigureAwait(false);
                    },
                    ct);
            }

            var readers = session.Shared
                ? Task.WhenAll(Enumerable.Range(1, Math.Max(2, Environment.ProcessorCount) - 1).Select(_ => session.JoinAsync(ct)))
                : Task.FromResult(Array.Empty<(NpgsqlConnection, NpgsqlTransaction)>());
            var keys = await LoadRunsAsync(session.Connection, session.Transaction, query, data, countYield, ct).ConfigureAwait(false);
            var connections = (await readers.ConfigureAwait(false)).Prepend((session.Connection, session.Transaction)).ToList();
            if (keys.Count > 0)
            {
                await FactoryReadingStream.ReadAsync(connections, query, keys, data, ct).ConfigureAwait(false);
            }

            if (countYield)
            {
                data.Tally = counting is null
                    ? await FactoryYieldCounter.CountAsync(session.Connection, session.Transaction, query, ct).ConfigureAwait(false)
                    : await counting.ConfigureAwait(false);
                if (query.FirstRunsOnly)
                {
                    data.Tally.FirstRunFlags = keys.FirstRunFlags;
                }
            }

            return data;
        }
        finally
        {
            if (counting is not null)
            {
                // Waited for even when the stream failed first: its connection is closed with the session.
                await Task.WhenAny(counting).ConfigureAwait(false);
            }
        }
    }

    private static async Task<RunIndex> LoadRunsAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, ReportData data, bool countYield, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction) { CommandTimeout = 0 };
        var where = FactoryFilterSql.Where(query, "r", command, runConditions: true);
        var operators = query.GroupBy == ReportGrouping.Operator;
        var outcome = countYield
            ? query.FirstRunsOnly ? $", row_number() OVER (PARTITION BY r.serial ORDER BY {FactoryYieldCounter.RunOrder("r")}) = 1" : string.Empty
            : ", r.serial, r.verdict, r.first_failing_reading, r.reason";
        command.CommandText = $"""
            SELECT r.chain_id, r.station_seq, r.ended_ticks, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision,
                   r.product, {(operators ? "r.operator" : "NULL::text")}{outcome}
              FROM runs r{where} ORDER BY {FactoryYieldCounter.RunOrder("r")};
            """;
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        var index = new RunIndex(countYield && query.FirstRunsOnly);
        var runs = data.Runs;
        string? lastSequence = null;
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var endedTicks = reader.GetInt64(2);
            var ended = new DateTimeOffset(endedTicks, TimeSpan.Zero);
            var sequenceId = reader.GetString(6);
            if (!string.Equals(sequenceId, lastSequence, StringComparison.Ordinal))
            {
                // The product of a sequence's first run, as the folder loader takes it.
                if (!data.Products.ContainsKey(sequenceId))
                {
                    data.AddProduct(sequenceId, reader.GetString(8));
                }

                lastSequence = sequenceId;
            }

            var station = reader.GetString(3);
            var slot = reader.GetInt32(4);
            var lot = NullableString(reader, 5);
            var revision = reader.GetInt32(7);
            var run = countYield
                ? runs.AddWithoutOutcome(ended, station, slot, lot, sequenceId, revision)
                : runs.Add(
                    reader.GetString(10),
                    ended,
                    FactoryYieldCounter.ParseVerdict(reader.GetString(11)),
                    station,
                    slot,
                    lot,
                    sequenceId,
                    revision,
                    NullableString(reader, 12),
                    NullableString(reader, 13));
            if (operators)
            {
                runs.SetOperator(run, NullableString(reader, 9));
            }

            index.Add(endedTicks, reader.GetGuid(0), reader.GetInt64(1), countYield && query.FirstRunsOnly && reader.GetBoolean(10));
        }

        return index;
    }

    private static string? NullableString(NpgsqlDataReader reader, int ordinal) => reader.IsDBNull(ordinal) ? null : reader.GetString(ordinal);
}
