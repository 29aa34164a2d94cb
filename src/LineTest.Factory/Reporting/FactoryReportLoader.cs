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
        // counts disagree. The yield is counted on a second connection that shares the snapshot, at the same time as
        // the runs and readings stream; where a snapshot cannot be shared (a server in recovery), one after the other.
        await using var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await using var transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
        Task<YieldTally>? counting = null;
        NpgsqlConnection? second = null;
        try
        {
            if (countYield)
            {
                (counting, second) = await StartCountingAsync(dataSource, connection, transaction, query, ct).ConfigureAwait(false);
            }

            var keys = await LoadRunsAsync(connection, transaction, query, data, countYield, ct).ConfigureAwait(false);
            if (keys.Count > 0)
            {
                await FactoryReadingStream.ReadAsync(connection, transaction, query, keys, data, ct).ConfigureAwait(false);
            }

            if (countYield)
            {
                data.Tally = counting is null
                    ? await FactoryYieldCounter.CountAsync(connection, transaction, query, ct).ConfigureAwait(false)
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
                // Observed even when the stream failed first, so its exception is not left unobserved.
                await Task.WhenAny(counting).ConfigureAwait(false);
            }

            if (second is not null)
            {
                await second.DisposeAsync().ConfigureAwait(false);
            }
        }
    }

    /// <summary>Starts counting the yield on a second connection that imports this transaction's snapshot.</summary>
    private static async Task<(Task<YieldTally>? Counting, NpgsqlConnection? Second)> StartCountingAsync(
        NpgsqlDataSource dataSource, NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, CancellationToken ct)
    {
        string snapshot;
        await transaction.SaveAsync("export", ct).ConfigureAwait(false);
        try
        {
            await using var export = new NpgsqlCommand("SELECT pg_export_snapshot();", connection, transaction);
            snapshot = (string)(await export.ExecuteScalarAsync(ct).ConfigureAwait(false))!;
            await transaction.ReleaseAsync("export", ct).ConfigureAwait(false);
        }
        catch (PostgresException)
        {
            // E.g. "cannot export a snapshot during recovery" on an older hot standby: count on this connection afterwards.
            await transaction.RollbackAsync("export", ct).ConfigureAwait(false);
            return (null, null);
        }

        var second = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        var task = Task.Run(
            async () =>
            {
                await using var secondTransaction = await second.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
                await using (var import = new NpgsqlCommand($"SET TRANSACTION SNAPSHOT '{snapshot.Replace("'", "''", StringComparison.Ordinal)}';", second, secondTransaction))
                {
                    await import.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
                }

                return await FactoryYieldCounter.CountAsync(second, secondTransaction, query, ct).ConfigureAwait(false);
            },
            ct);
        return (task, second);
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
