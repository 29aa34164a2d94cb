using System.Buffers;
using System.Diagnostics;
using System.Text;
using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting.Packs;

/// <summary>
/// Loads a report's runs and readings from <c>run_packs</c> (see <see cref="RunPack"/>) in one repeatable-read
/// snapshot, once the packs hold every run of that snapshot: the months of packs are read on several connections at
/// once, each run is kept or left out by the report's conditions exactly as the SQL conditions of the row path would,
/// and runs and readings are put into the factory's run order (end instant, station, station database, seq) and
/// reading order, as the rows would have come. The report (yield counted from the runs, as for station folders) is
/// therefore the same as from the rows or from the folders.
/// </summary>
internal static partial class PackedReportLoader
{
    /// <summary>
    /// The data, or null when the snapshot has runs the packs do not hold yet (forwarded since they were built): the
    /// caller builds again or reads the rows.
    /// </summary>
    public static async Task<ReportData?> TryLoadAsync(NpgsqlDataSource dataSource, ReportQuery query, FactoryLoadTimes? times, long started, CancellationToken ct)
    {
        await using var session = await SharedSnapshot.OpenAsync(dataSource, ct).ConfigureAwait(false);

        // The other connections join the snapshot while this one asks what to read.
        var joining = session.Shared
            ? Enumerable.Range(1, Math.Max(2, Environment.ProcessorCount) - 1).Select(_ => session.JoinAsync(ct)).ToArray()
            : [];
        try
        {
            return await LoadAsync(session, joining, dataSource, query, times, started, ct).ConfigureAwait(false);
        }
        finally
        {
            // Every join is over before the session closes its connections.
            await Task.WhenAll(joining.Select(j => j.ContinueWith(_ => { }, CancellationToken.None, TaskContinuationOptions.None, TaskScheduler.Default))).ConfigureAwait(false);
        }
    }

    private static async Task<ReportData?> LoadAsync(
        SharedSnapshot session,
        Task<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)>[] joining,
        NpgsqlDataSource dataSource,
        ReportQuery query,
        FactoryLoadTimes? times,
        long started,
        CancellationToken ct)
    {
        if ((await RunPackBuilder.StaleChainsAsync(session.Connection, session.Transaction, ct).ConfigureAwait(false)).Count > 0)
        {
            return null;
        }

        // Packs written by another version of LineTest (another format) are built again, never misread.
        if ((await RunPackBuilder.PacksOfAnotherFormatAsync(session.Connection, session.Transaction, ct).ConfigureAwait(false)).Count > 0)
        {
            return null;
        }

        var marks = await MarksAsync(session, ct).ConfigureAwait(false);
        var months = await MonthsAsync(session, query, ct).ConfigureAwait(false);
        var data = new ReportData();
        data.AddSource(Schema.FactoryConnection.Describe(dataSource));
        if (months.Count == 0)
        {
            return data;
        }

        var connections = new List<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> { (session.Connection, session.Transaction) };
        connections.AddRange(await Task.WhenAll(joining).ConfigureAwait(false));

        // Each connection reads and orders its months in turn; the months are placed here in order as each is ready,
        // and let go once placed.
        var readTimes = new ReadTimes();
        // Without conditions on the runs themselves, the months' runs are all kept (the time window only trims the
        // first and last month), so the table is sized once for them instead of growing month by month.
        // The count is only a hint (a pack is read whole whatever it says): one out of any reason is not used.
        var packed = months.Sum(m => m.Runs);
        if (query.Station is null && query.Lot is null && query.SequenceId is null && query.Slot is null && query.SequenceRevision is null
            && packed is > 0 and <= int.MaxValue / 16)
        {
            data.Runs.EnsureCapacity((int)packed);
        }

        var placer = new Placer(data, query, [.. months.Select(m => m.Runs)]);
        await InOrderReads.RunAsync(
            connections,
            months.Count,
            async (c, m, token) =>
            {
                var packs = await ReadMonthAsync(c.Connection, c.Transaction, months[m].Month, token).ConfigureAwait(false);
                var read = Stopwatch.GetElapsedTime(started);
                var selected = MonthRuns.Select(packs, query, marks);
                lock (readTimes)
                {
                    readTimes.Read = read > readTimes.Read ? read : readTimes.Read;
                    readTimes.Ordered = Stopwatch.GetElapsedTime(started);
                }

                return selected;
            },
            placer.Place,
            ct).ConfigureAwait(false);
        if (times is not null)
        {
            times.RunsRead = readTimes.Read;
            times.ReadingsRead = readTimes.Ordered;
            times.ReadingsPlaced = Stopwatch.GetElapsedTime(started);
        }

        return data;
    }

    private static async Task<Dictionary<Guid, long>> MarksAsync(SharedSnapshot session, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand("SELECT chain_id, packed_seq FROM run_pack_marks;", session.Connection, session.Transaction);
        var marks = new Dictionary<Guid, long>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            marks.Add(reader.GetGuid(0), reader.GetInt64(1));
        }

        return marks;
    }

    /// <summary>The months of packs that can hold runs in the report's time window, in order, with how many runs their packs hold.</summary>
    private static async Task<List<(DateTime Month, long Runs)>> MonthsAsync(SharedSnapshot session, ReportQuery query, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, session.Connection, session.Transaction);
        var conditions = new List<string>();
        if (query.FromUtc is { } from)
        {
            conditions.Add("month >= @from");
            command.Parameters.AddWithValue("from", MonthOf(from.UtcTicks));
        }

        if (query.ToUtc is { } to)
        {
            conditions.Add("month <= @to");
            command.Parameters.AddWithValue("to", MonthOf(to.UtcTicks));
        }

        // Only months whose partition of runs is still attached: a month archived (detached, dropped) is no longer in a
        // report from the rows, so its packs are left out too.
        conditions.Add("""
            EXISTS (SELECT 1 FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid
                     WHERE i.inhparent = 'runs'::regclass AND c.relname = 'runs_' || to_char(month AT TIME ZONE 'UTC', 'YYYY"m"MM'))
            """);
        command.CommandText = $"SELECT month, sum(runs) FROM run_packs WHERE {string.Join(" AND ", conditions)} GROUP BY month ORDER BY month;";
        var months = new List<(DateTime Month, long Runs)>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            months.Add((DateTime.SpecifyKind(reader.GetDateTime(0), DateTimeKind.Utc), reader.GetInt64(1)));
        }

        return months;
    }

    private static DateTime MonthOf(long ticks)
    {
        var at = new DateTime(ticks, DateTimeKind.Utc);
        return new DateTime(at.Year, at.Month, 1, 0, 0, 0, DateTimeKind.Utc);
    }

    private static async Task<List<RunPack>> ReadMonthAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, DateTime month, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand("SELECT chain_id, body FROM run_packs WHERE month = @m;", connection, transaction) { CommandTimeout = 0 };
        command.Parameters.AddWithValue("m", month);
        var packs = new List<RunPack>();
        await using var reader = await command.ExecuteReaderAsync(System.Data.CommandBehavior.SequentialAccess, ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var chain = reader.GetGuid(0);

            // Read into a pooled buffer: a hundred packs of a few megabytes each would otherwise be as many large arrays
            // for the garbage collector, soon after being decoded.
            var length = checked((int)reader.GetBytes(1, 0, null, 0, 0));
            var body = ArrayPool<byte>.Shared.Rent(length);
            RunPack pack;
            try
            {
                await using (var stream = await reader.GetStreamAsync(1, ct).ConfigureAwait(false))
                {
                    await stream.ReadExactlyAsync(body.AsMemory(0, length), ct).ConfigureAwait(false);
                }

                pack = RunPack.FromBytes(body.AsSpan(0, length));
            }
            catch (InvalidDataException ex)
            {
                throw new InvalidDataException($"The run pack of station database {chain:D} for {month:yyyy-MM} cannot be read: {ex.Message} Delete it (DELETE FROM run_packs WHERE chain_id = '{chain:D}'; DELETE FROM run_pack_marks WHERE chain_id = '{chain:D}';) and it is built again from the runs.", ex);
            }
            finally
            {
                ArrayPool<byte>.Shared.Return(body);
            }

            if (pack.Chain != chain)
            {
                throw new InvalidDataException($"The run pack stored for station database {chain:D} ({month:yyyy-MM}) holds station database {pack.Chain:D}.");
            }

            packs.Add(pack);
        }

        return packs;
    }

    /// <summary>When the last month's packs were read and when its runs were put in order.</summary>
    private sealed class ReadTimes
    {
        public TimeSpan Read { get; set; }

        public TimeSpan Ordered { get; set; }
    }

    /// <summary>One month's packs and the runs kept from them, in run order.</summary>
    private sealed class MonthRuns
    {
        public required List<RunPack> Packs { get; init; }

        /// <summary>The kept runs in run order: pack number in the high 32 bits, run in the low.</summary>
        public required long[] Order { get; init; }

        public static MonthRuns Select(List<RunPack> packs, ReportQuery query, Dictionary<Guid, long> marks)
        {
            var total = packs.Sum(p => p.Runs);
            var order = new long[total];
            var ticks = new long[total];
            var n = 0;
            var from = query.FromUtc?.UtcTicks ?? long.MinValue;
            var to = query.ToUtc?.UtcTicks ?? long.MaxValue;
            for (var p = 0; p < packs.Count; p++)
            {
                var pack = packs[p];
                var mark = marks.TryGetValue(pack.Chain, out var m) ? m : long.MinValue;

                // The run conditions of FactoryFilterSql, asked of the pack's runs (a text the pack does not hold matches
                // none of its runs).
                int Number(string? text) => text is null ? -2 : Array.IndexOf(pack.Texts, text);
                var station = Number(query.Station);
                var lot = Number(query.Lot);
                var sequence = Number(query.SequenceId);
                var slot = query.Slot ?? int.MinValue;
                var revision = query.SequenceRevision ?? int.MinValue;
                for (var r = 0; r < pack.Runs; r++)
                {
                    var ended = pack.EndedTicks[r];
                    if (pack.Seq[r] > mark || ended < from || ended >= to
                        || (station != -2 && pack.Station[r] != station)
                        || (query.Slot is not null && pack.Slot[r] != slot)
                        || (lot != -2 && pack.Lot[r] != lot)
                        || (sequence != -2 && pack.Sequence[r] != sequence)
                        || (query.SequenceRevision is not null && pack.Revision[r] != revision))
                    {
                        continue;
                    }

                    order[n] = ((long)p << 32) | (uint)r;
                    ticks[n] = ended;
                    n++;
                }
            }

            Array.Resize(ref order, n);
            Array.Resize(ref ticks, n);

            // The factory's run order: end instant, station (bytewise, COLLATE "C"), station database (uuid order:
            // bytewise), seq. Sorted by the instant as numbers, then each run of equal instants by the rest.
            Array.Sort(ticks, order);
            var ties = new TieOrder(packs);
            for (var i = 0; i < n;)
            {
                var j = i + 1;
                while (j < n && ticks[j] == ticks[i])
                {
                    j++;
                }

                if (j - i > 1)
                {
                    Array.Sort(order, i, j - i, ties);
                }

                i = j;
            }

            return new MonthRuns { Packs = packs, Order = order };
        }
    }

    /// <summary>Orders runs that ended at the same instant: by station (bytewise), station database (bytewise), seq.</summary>
    private sealed class TieOrder(List<RunPack> packs) : IComparer<long>
    {
        private readonly byte[][] _chains = [.. packs.Select(p => p.Chain.ToByteArray(bigEndian: true))];
        private readonly Dictionary<string, byte[]> _stations = new(StringComparer.Ordinal);

        public int Compare(long a, long b)
        {
            var (pa, ra) = ((int)(a >> 32), (int)a);
            var (pb, rb) = ((int)(b >> 32), (int)b);
            var c = Station(pa, ra).AsSpan().SequenceCompareTo(Station(pb, rb));
            if (c != 0)
            {
                return c;
            }

            c = _chains[pa].AsSpan().SequenceCompareTo(_chains[pb]);
            return c != 0 ? c : packs[pa].Seq[ra].CompareTo(packs[pb].Seq[rb]);
        }

        private byte[] Station(int pack, int run)
        {
            var text = packs[pack].Texts[packs[pack].Station[run]];
            if (!_stations.TryGetValue(text, out var bytes))
            {
                bytes = Encoding.UTF8.GetBytes(text);
                _stations.Add(text, bytes);
            }

            return bytes;
        }
    }
}
