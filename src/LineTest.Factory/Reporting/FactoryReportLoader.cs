using System.Diagnostics;
using LineTest.Factory.Reporting.Packs;
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
        LoadAsync(dataSource, query, countYield: false, times: null, ct);

    /// <summary>
    /// Loads the data for a report with the yield counted in SQL (<see cref="ReportData.Tally"/>: yield, first-pass
    /// yield and Pareto per group and day), and the runs without serials or outcomes: only what places each reading
    /// (time, station, slot, lot, sequence) and the reading values, which the statistics that SQL cannot do (moving
    /// ranges in run order, normality, percentiles) need one by one. The report is the same as from
    /// <see cref="LoadAsync(NpgsqlDataSource, ReportQuery, CancellationToken)"/>, with far less read.
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    public static Task<ReportData> LoadCountedAsync(NpgsqlDataSource dataSource, ReportQuery query, CancellationToken ct = default) =>
        LoadAsync(dataSource, query, countYield: true, times: null, ct);

    /// <summary>
    /// Loads the data for a report from the packs of runs (<c>run_packs</c>), first building the packs of runs forwarded
    /// since they were last built: a report over a million runs reads about a hundred packs instead of six million rows.
    /// The runs come with their outcomes and the yield is counted from them, as for station folders, so the report is the
    /// same as from <see cref="LoadAsync(NpgsqlDataSource, ReportQuery, CancellationToken)"/>. Where the packs cannot be
    /// built (a read-only replica, a database of schema version 1) or keep falling behind stations that forward while the
    /// report starts, the rows are read instead (<see cref="LoadCountedAsync(NpgsqlDataSource, ReportQuery, CancellationToken)"/>).
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached or read.</exception>
    /// <exception cref="InvalidDataException">A stored pack is damaged (the message says how to have it built again).</exception>
    /// <param name="dataSource">The factory database.</param>
    /// <param name="query">The report's conditions.</param>
    /// <param name="times">Where the load spent its time (for the benchmark), or null.</param>
    /// <param name="building">Told, before packs are built, about how many runs were forwarded since the last build (so
    /// a command can say why the first report after many runs takes longer), or null.</param>
    /// <param name="ct">Cancels the load.</param>
    public static async Task<ReportData> LoadPackedAsync(
        NpgsqlDataSource dataSource, ReportQuery query, FactoryLoadTimes? times = null, Action<long>? building = null, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        ArgumentNullException.ThrowIfNull(query);
        var started = Stopwatch.GetTimestamp();
        // Read the packs if they are current; otherwise build what is missing and try again (stations may keep
        // forwarding meanwhile), and after three tries, or where packs cannot be built, read the rows.
        var canBuild = true;
        for (var attempt = 0; attempt < 3; attempt++)
        {
            ReportData? data;
            try
            {
                data = await PackedReportLoader.TryLoadAsync(dataSource, query, times, started, ct).ConfigureAwait(false);
            }
            catch (PostgresException ex) when (ex.SqlState == PostgresErrorCodes.UndefinedTable)
            {
                // No run_packs (schema version 1) or no factory database at all: the rows say which.
                break;
            }

            if (data is not null)
            {
                if (times is not null)
                {
                    times.FromPacks = true;
                }

                return data;
            }

            if (!canBuild)
            {
                break;
            }

            try
            {
                var refresh = await RunPackBuilder.RefreshAsync(dataSource, building, ct).ConfigureAwait(false);
                if (times is not null)
                {
                    times.PacksBuilt = Stopwatch.GetElapsedTime(started);
                    times.PacksWritten += refresh.Packs;
                }
            }
            catch (PostgresException ex) when (CannotBuildPacks(ex))
            {
                // A read-only server: the packs built elsewhere are not current, so the rows are read.
                canBuild = false;
            }
        }

        return await LoadAsync(dataSource, query, countYield: true, times, ct).ConfigureAwait(false);
    }

    /// <summary>
    /// Builds the packs of runs forwarded since they were last built (all of them the first time), as a report does before
    /// it reads them; returns how many packs were written, the runs they hold and how long it took.
    /// </summary>
    /// <exception cref="NpgsqlException">The database cannot be reached, read or written.</exception>
    public static async Task<(int Packs, long Runs, TimeSpan Elapsed)> BuildPacksAsync(NpgsqlDataSource dataSource, CancellationToken ct = default)
    {
        var refresh = await RunPackBuilder.RefreshAsync(dataSource, building: null, ct).ConfigureAwait(false);
        return (refresh.Packs, refresh.Runs, refresh.Elapsed);
    }

    /// <summary>The server will not let this connection build packs (no table, read-only, no right to write).</summary>
    private static bool CannotBuildPacks(PostgresException ex) => ex.SqlState is PostgresErrorCodes.UndefinedTable
        or PostgresErrorCodes.ReadOnlySqlTransaction
        or PostgresErrorCodes.InsufficientPrivilege
        or PostgresErrorCodes.ObjectNotInPrerequisiteState;

    private static async Task<ReportData> LoadAsync(NpgsqlDataSource dataSource, ReportQuery query, bool countYield, FactoryLoadTimes? times, CancellationToken ct)
    {
        var started = Stopwatch.GetTimestamp();
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

            var others = session.Shared
                ? await Task.WhenAll(Enumerable.Range(1, Math.Max(2, Environment.ProcessorCount) - 1).Select(_ => session.JoinAsync(ct))).ConfigureAwait(false)
                : [];
            var connections = others.Prepend((session.Connection, session.Transaction)).ToList();
            var (keys, months) = await LoadRunsAsync(connections, query, data, countYield, ct).ConfigureAwait(false);
            if (times is not null)
            {
                times.RunsRead = Stopwatch.GetElapsedTime(started);
            }

            if (keys.Count > 0)
            {
                await FactoryReadingStream.ReadAsync(connections, query, keys, months, data, times, started, ct).ConfigureAwait(false);
            }

            if (countYield)
            {
                data.Tally = counting is null
                    ? await FactoryYieldCounter.CountAsync(session.Connection, session.Transaction, query, ct).ConfigureAwait(false)
                    : await counting.ConfigureAwait(false);
                if (times is not null)
                {
                    times.YieldCounted = Stopwatch.GetElapsedTime(started);
                }

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

    /// <summary>
    /// Loads the runs into <paramref name="data"/> and returns their index and the UTC months from the first run's to
    /// the last run's (none when no run matches): month by month on all <paramref name="connections"/> at once,
    /// appended in month order (the run order), or in one query when first runs are marked (a unit's first run may lie
    /// in an earlier month).
    /// </summary>
    private static async Task<(RunIndex Index, List<(DateTime From, DateTime To)> Months)> LoadRunsAsync(
        IReadOnlyList<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> connections,
        ReportQuery query,
        ReportData data,
        bool countYield,
        CancellationToken ct)
    {
        var index = new RunIndex(countYield && query.FirstRunsOnly);
        if (await BoundsAsync(connections[0].Connection, connections[0].Transaction, query, ct).ConfigureAwait(false) is not { } bounds)
        {
            return (index, []);
        }

        var months = FactoryReadingStream.Months(bounds.First, bounds.Last);
        IReadOnlyList<(DateTime From, DateTime To)?> runMonths = query.FirstRunsOnly || connections.Count == 1
            ? [null]
            : [.. months.Select(m => ((DateTime, DateTime)?)m)];
        // Each connection reads its months in turn; the months are appended here in order as soon as each is read, so
        // only the months in flight are held, not all the runs twice.
        await InOrderReads.RunAsync(
            connections,
            runMonths.Count,
            (c, m, token) => ReadRunsAsync(c.Connection, query, countYield, runMonths[m], token),
            rows => Append(rows, data, index, query, countYield),
            ct).ConfigureAwait(false);
        return (index, months);
    }

    private static void Append(List<RunRow> rows, ReportData data, RunIndex index, ReportQuery query, bool countYield)
    {
        var runs = data.Runs;
        foreach (var row in rows)
        {
            if (row.Product is { } product && !data.Products.ContainsKey(row.SequenceId))
            {
                // The product of a sequence's first run, as the folder loader takes it.
                data.AddProduct(row.SequenceId, product);
            }

            var ended = new DateTimeOffset(row.EndedTicks, TimeSpan.Zero);
            var run = countYield
                ? runs.AddWithoutOutcome(ended, row.Station, row.Slot, row.Lot, row.SequenceId, row.Revision)
                : runs.Add(row.Serial!, ended, row.Verdict, row.Station, row.Slot, row.Lot, row.SequenceId, row.Revision, row.Failure, row.Reason);
            if (query.GroupBy == ReportGrouping.Operator)
            {
                runs.SetOperator(run, row.Operator);
            }

            index.Add(row.Chain, row.Seq, row.FirstRun);
        }
    }

    /// <summary>The first and last end (ticks) of the runs matching <paramref name="query"/>; null when none match.</summary>
    private static async Task<(long First, long Last)?> BoundsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, ReportQuery query, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction) { CommandTimeout = 0 };
        var where = FactoryFilterSql.Where(query, "r", command, runConditions: true);
        command.CommandText = $"SELECT min(r.ended_ticks), max(r.ended_ticks) FROM runs r{where};";
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        return await reader.ReadAsync(ct).ConfigureAwait(false) && !reader.IsDBNull(0) ? (reader.GetInt64(0), reader.GetInt64(1)) : null;
    }

    private static async Task<List<RunRow>> ReadRunsAsync(
        NpgsqlConnection connection, ReportQuery query, bool countYield, (DateTime From, DateTime To)? month, CancellationToken ct)
    {
        var where = FactoryFilterSql.WhereLiteral(query, "r", runConditions: true, month);
        var operators = query.GroupBy == ReportGrouping.Operator;
        var firstRuns = countYield && query.FirstRunsOnly;
        var outcome = countYield
            ? firstRuns ? $", row_number() OVER (PARTITION BY r.serial ORDER BY {FactoryYieldCounter.RunOrder("r")}) = 1" : string.Empty
            : ", r.serial, r.verdict, r.first_failing_reading, r.reason";
        var fields = 10 + (countYield ? firstRuns ? 1 : 0 : 4);

        // Binary COPY, decoded in place (see CopyBinaryReader); stations, lots and sequences repeat, so each is one
        // string, not one per run.
        await using var reader = await CopyBinaryReader.StartAsync(
            connection,
            $"""
            COPY (SELECT r.chain_id, r.station_seq, r.ended_ticks, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision,
                         r.product, {(operators ? "r.operator" : "NULL::text")}{outcome}
                    FROM runs r{where} ORDER BY {FactoryYieldCounter.RunOrder("r")}) TO STDOUT (FORMAT BINARY)
            """,
            fields,
            ct).ConfigureAwait(false);
        var texts = new CopyTextCache();
        var people = new CopyTextCache();
        var reasons = new CopyTextCache();
        var rows = new List<RunRow>();
        string? lastSequence = null;
        while (await reader.NextRowAsync(ct).ConfigureAwait(false))
        {
            var chain = reader.ReadGuid();
            var seq = reader.ReadInt64();
            var ended = reader.ReadInt64();
            var station = reader.ReadText(texts) ?? throw NullColumn("station", reader.Row);
            var slot = reader.ReadInt32();
            var lot = reader.ReadText(texts);
            var sequenceId = reader.ReadText(texts) ?? throw NullColumn("sequence_id", reader.Row);
            var revision = reader.ReadInt32();

            // The product is taken from a sequence's first run only (as the folder loader does).
            string? product = null;
            if (!ReferenceEquals(sequenceId, lastSequence))
            {
                product = reader.ReadText(texts) ?? throw NullColumn("product", reader.Row);
                lastSequence = sequenceId;
            }
            else
            {
                reader.TryReadText(out _);
            }

            var person = reader.ReadText(people);
            rows.Add(new RunRow(
                ended,
                chain,
                seq,
                station,
                slot,
                lot,
                sequenceId,
                revision,
                product,
                operators ? person : null,
                countYield ? null : reader.ReadText() ?? throw NullColumn("serial", reader.Row),
                countYield ? default : FactoryYieldCounter.ParseVerdict(reader.ReadText(texts) ?? throw NullColumn("verdict", reader.Row)),
                countYield ? null : reader.ReadText(reasons),
                countYield ? null : reader.ReadText(reasons),
                firstRuns && reader.ReadBoolean()));
        }

        return rows;
    }

    private static InvalidDataException NullColumn(string column, long row) => new($"Run row {row}: column {column} is NULL, which the schema does not allow.");
}
