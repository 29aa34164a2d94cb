using System.Diagnostics;
using System.Globalization;
using System.Text;
using LineTest.Core.Results;
using Npgsql;

namespace LineTest.Factory.Reporting.Packs;

/// <summary>
/// Brings <c>run_packs</c> up to date with <c>runs</c> and <c>readings</c>: for every station database (chain) with
/// runs above its mark in <c>run_pack_marks</c>, the packs of the months those runs ended in are built again from the
/// rows, and the mark moved to the chain's last run, in one transaction. Runs arrive in seq order, so the months not
/// touched already hold every run of the chain up to the new mark. One builder at a time (an advisory lock); a report
/// that finds the packs current reads them instead of millions of rows.
/// </summary>
internal static class RunPackBuilder
{
    private const long LockKey = 0x4C54_5041_434B; // 'LTPACK'

    /// <summary>Builds what is missing; returns how many packs were written and how many runs they hold.</summary>
    /// <exception cref="PostgresException">The server refused (e.g. a read-only replica, or no <c>run_packs</c> table).</exception>
    /// <param name="dataSource">The factory database.</param>
    /// <param name="building">Told, before a build starts, about how many runs were forwarded since the last one; or null.</param>
    /// <param name="ct">Cancels the build (nothing is written then).</param>
    public static async Task<PackRefresh> RefreshAsync(NpgsqlDataSource dataSource, Action<long>? building, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        var started = Stopwatch.GetTimestamp();
        await using var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await using var transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.ReadCommitted, ct).ConfigureAwait(false);
        await using (var lockCommand = new NpgsqlCommand("SELECT pg_advisory_xact_lock(@key);", connection, transaction))
        {
            lockCommand.Parameters.AddWithValue("key", LockKey);
            await lockCommand.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        }

        // Read after the lock, each statement on a fresh snapshot: a builder that waited sees what the one before wrote.
        var stale = await StaleChainsAsync(connection, transaction, ct).ConfigureAwait(false);
        var rebuild = await PacksOfAnotherFormatAsync(connection, transaction, ct).ConfigureAwait(false);
        if (stale.Count == 0 && rebuild.Count == 0)
        {
            await transaction.CommitAsync(ct).ConfigureAwait(false);
            return new PackRefresh(0, 0, Stopwatch.GetElapsedTime(started));
        }

        // Seqs number a station's runs, so the distance from the mark is about the runs to add.
        building?.Invoke(stale.Sum(c => c.Last - Math.Max(0, c.Packed ?? 0)));

        // Each stale chain's mark is its last run now; runs above it may arrive meanwhile and wait for the next build.
        var marks = new Dictionary<Guid, long>();
        foreach (var chain in stale)
        {
            marks[chain.Chain] = chain.Last;
        }

        var months = new SortedDictionary<DateTime, HashSet<Guid>>();
        foreach (var chain in stale)
        {
            foreach (var month in await MonthsAboveAsync(connection, transaction, chain.Chain, chain.Packed, chain.Last, ct).ConfigureAwait(false))
            {
                Add(months, month, chain.Chain);
            }
        }

        foreach (var (chain, month) in rebuild)
        {
            if (!marks.ContainsKey(chain))
            {
                marks[chain] = await PackedSeqAsync(connection, transaction, chain, ct).ConfigureAwait(false);
            }

            Add(months, month, chain);
        }

        var packs = 0;
        var runs = 0L;
        foreach (var (month, chains) in months)
        {
            var keys = chains.ToDictionary(c => c, c => marks[c]);
            var built = await BuildMonthAsync(connection, keys, month, ct).ConfigureAwait(false);
            foreach (var chain in chains)
            {
                if (built.TryGetValue(chain, out var pack))
                {
                    await WriteAsync(connection, transaction, month, pack, ct).ConfigureAwait(false);
                    packs++;
                    runs += pack.Runs;
                }
                else
                {
                    await DeleteAsync(connection, transaction, month, chain, ct).ConfigureAwait(false);
                }
            }
        }

        foreach (var chain in stale)
        {
            await using var mark = new NpgsqlCommand(
                """
                INSERT INTO run_pack_marks (chain_id, packed_seq) VALUES (@c, @s)
                ON CONFLICT (chain_id) DO UPDATE SET packed_seq = excluded.packed_seq, built_utc = now();
                """,
                connection,
                transaction);
            mark.Parameters.AddWithValue("c", chain.Chain);
            mark.Parameters.AddWithValue("s", chain.Last);
            await mark.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
        }

        await transaction.CommitAsync(ct).ConfigureAwait(false);
        return new PackRefresh(packs, runs, Stopwatch.GetElapsedTime(started));
    }

    /// <summary>
    /// The chains with runs above their mark (none for a chain never packed): chain, its mark (or null) and its last run.
    /// The last run per chain is one index probe per month (<c>ix_runs_chain</c>), not a scan.
    /// </summary>
    internal static async Task<List<(Guid Chain, long? Packed, long Last)>> StaleChainsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(
            """
            SELECT c.chain_id, m.packed_seq, (SELECT max(r.station_seq) FROM runs r WHERE r.chain_id = c.chain_id)
              FROM chains c LEFT JOIN run_pack_marks m ON m.chain_id = c.chain_id;
            """,
            connection,
            transaction) { CommandTimeout = 0 };
        var stale = new List<(Guid, long?, long)>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            if (reader.IsDBNull(2))
            {
                continue;
            }

            long? packed = reader.IsDBNull(1) ? null : reader.GetInt64(1);
            var last = reader.GetInt64(2);
            if (packed is null || last > packed)
            {
                stale.Add((reader.GetGuid(0), packed, last));
            }
        }

        return stale;
    }

    /// <summary>The packs written in another format than <see cref="RunPack.Format"/> (by another version of LineTest).</summary>
    internal static async Task<List<(Guid Chain, DateTime Month)>> PacksOfAnotherFormatAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand("SELECT chain_id, month FROM run_packs WHERE format <> @f;", connection, transaction);
        command.Parameters.AddWithValue("f", RunPack.Format);
        var list = new List<(Guid, DateTime)>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            list.Add((reader.GetGuid(0), reader.GetDateTime(1)));
        }

        return list;
    }

    private static async Task<long> PackedSeqAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, Guid chain, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand("SELECT packed_seq FROM run_pack_marks WHERE chain_id = @c;", connection, transaction);
        command.Parameters.AddWithValue("c", chain);
        return await command.ExecuteScalarAsync(ct).ConfigureAwait(false) is long seq ? seq : long.MaxValue;
    }

    /// <summary>The UTC months in which the chain's runs in (packed, last] ended.</summary>
    private static async Task<List<DateTime>> MonthsAboveAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, Guid chain, long? packed, long last, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(
            """
            SELECT DISTINCT date_trunc('month', r.ended_utc AT TIME ZONE 'UTC')
              FROM runs r WHERE r.chain_id = @c AND r.station_seq > @from AND r.station_seq <= @to;
            """,
            connection,
            transaction) { CommandTimeout = 0 };
        command.Parameters.AddWithValue("c", chain);
        command.Parameters.AddWithValue("from", packed ?? long.MinValue);
        command.Parameters.AddWithValue("to", last);
        var months = new List<DateTime>();
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            months.Add(DateTime.SpecifyKind(reader.GetDateTime(0), DateTimeKind.Utc));
        }

        return months;
    }

    private static void Add(SortedDictionary<DateTime, HashSet<Guid>> months, DateTime month, Guid chain)
    {
        var key = DateTime.SpecifyKind(month, DateTimeKind.Utc);
        if (!months.TryGetValue(key, out var chains))
        {
            chains = [];
            months.Add(key, chains);
        }

        chains.Add(chain);
    }

    /// <summary>The packs of one month for the given chains, each holding the chain's runs up to its mark.</summary>
    private static async Task<Dictionary<Guid, RunPack>> BuildMonthAsync(
        NpgsqlConnection connection, Dictionary<Guid, long> marks, DateTime month, CancellationToken ct)
    {
        var keys = new StringBuilder();
        foreach (var (chain, mark) in marks)
        {
            keys.Append(keys.Length == 0 ? string.Empty : ", ")
                .Append(CultureInfo.InvariantCulture, $"('{chain:D}'::uuid, {mark.ToString(CultureInfo.InvariantCulture)}::bigint)");
        }

        var window = $"ended_utc >= {SqlLiteral.Of(NpgsqlTypes.NpgsqlDbType.TimestampTz, month)} AND ended_utc < {SqlLiteral.Of(NpgsqlTypes.NpgsqlDbType.TimestampTz, month.AddMonths(1))}";
        var builders = new Dictionary<Guid, PackBuilder>();
        await using (var reader = await CopyBinaryReader.StartAsync(
            connection,
            $"""
            COPY (SELECT r.chain_id, r.station_seq, r.ended_ticks, r.station, r.slot, r.lot, r.sequence_id, r.sequence_revision,
                         r.product, r.operator, r.serial, r.verdict, r.first_failing_reading, r.reason
                    FROM runs r JOIN (VALUES {keys}) AS k (chain_id, mark) ON r.chain_id = k.chain_id AND r.station_seq <= k.mark
                   WHERE r.{window}) TO STDOUT (FORMAT BINARY)
            """,
            fields: 14,
            ct).ConfigureAwait(false))
        {
            while (await reader.NextRowAsync(ct).ConfigureAwait(false))
            {
                var chain = reader.ReadGuid();
                if (!builders.TryGetValue(chain, out var builder))
                {
                    builder = new PackBuilder(chain);
                    builders.Add(chain, builder);
                }

                builder.AddRun(reader);
            }
        }

        await using (var reader = await CopyBinaryReader.StartAsync(
            connection,
            $"""
            COPY (SELECT g.chain_id, g.station_seq, g.ordinal, g.name, g.value, g.unit, g.low, g.high
                    FROM readings g JOIN (VALUES {keys}) AS k (chain_id, mark) ON g.chain_id = k.chain_id AND g.station_seq <= k.mark
                   WHERE g.{window}) TO STDOUT (FORMAT BINARY)
            """,
            fields: 8,
            ct).ConfigureAwait(false))
        {
            while (await reader.NextRowAsync(ct).ConfigureAwait(false))
            {
                var chain = reader.ReadGuid();
                if (builders.TryGetValue(chain, out var builder))
                {
                    builder.AddReading(reader);
                }
            }
        }

        return builders.ToDictionary(b => b.Key, b => b.Value.Build());
    }

    private static async Task WriteAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, DateTime month, RunPack pack, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(
            """
            INSERT INTO run_packs (month, chain_id, runs, readings, last_seq, format, body) VALUES (@m, @c, @r, @g, @s, @f, @b)
            ON CONFLICT (month, chain_id) DO UPDATE SET runs = excluded.runs, readings = excluded.readings, last_seq = excluded.last_seq,
                format = excluded.format, body = excluded.body, built_utc = now();
            """,
            connection,
            transaction) { CommandTimeout = 0 };
        command.Parameters.AddWithValue("m", month);
        command.Parameters.AddWithValue("c", pack.Chain);
        command.Parameters.AddWithValue("r", pack.Runs);
        command.Parameters.AddWithValue("g", (long)pack.Readings);
        command.Parameters.AddWithValue("s", pack.LastSeq);
        command.Parameters.AddWithValue("f", RunPack.Format);
        command.Parameters.AddWithValue("b", pack.ToBytes());
        await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
    }

    private static async Task DeleteAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, DateTime month, Guid chain, CancellationToken ct)
    {
        await using var command = new NpgsqlCommand("DELETE FROM run_packs WHERE month = @m AND chain_id = @c;", connection, transaction);
        command.Parameters.AddWithValue("m", month);
        command.Parameters.AddWithValue("c", chain);
        await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
    }

    /// <summary>Collects one chain-month's rows into a <see cref="RunPack"/>.</summary>
    private sealed class PackBuilder(Guid chain)
    {
        private readonly Dictionary<string, int> _textIndex = new(StringComparer.Ordinal);
        private readonly List<string> _texts = [];
        private readonly CopyTextCache _cache = new();
        private readonly Dictionary<long, int> _runOfSeq = [];
        private readonly List<(long Ticks, long Seq, int Station, int Slot, int Lot, int Sequence, int Revision, int Product, int Operator, string Serial, Verdict Verdict, int Failure, int Reason)> _runs = [];
        private readonly Dictionary<PackShape, int> _shapeIndex = [];
        private readonly List<PackShape> _shapes = [];
        private readonly List<(int Run, int Ordinal, int Shape, double Value)> _readings = [];

        public void AddRun(CopyBinaryReader reader)
        {
            var seq = reader.ReadInt64();
            var ticks = reader.ReadInt64();
            var station = Text(reader, "station");
            var slot = reader.ReadInt32();
            var lot = NullableText(reader);
            var sequence = Text(reader, "sequence_id");
            var revision = reader.ReadInt32();
            var product = Text(reader, "product");
            var person = NullableText(reader);
            var serial = reader.ReadText() ?? throw Null("serial", reader.Row);
            var verdict = FactoryYieldCounter.ParseVerdict(reader.ReadText(_cache) ?? throw Null("verdict", reader.Row));
            var failure = NullableText(reader);
            var reason = NullableText(reader);
            if (!_runOfSeq.TryAdd(seq, _runs.Count))
            {
                throw new InvalidDataException($"Run {seq} of station database {chain:D} is stored twice.");
            }

            _runs.Add((ticks, seq, station, slot, lot, sequence, revision, product, person, serial, verdict, failure, reason));
        }

        public void AddReading(CopyBinaryReader reader)
        {
            var seq = reader.ReadInt64();
            if (!_runOfSeq.TryGetValue(seq, out var run))
            {
                // A reading whose run ended in another month cannot be: readings carry their run's end.
                throw new InvalidDataException($"A reading of run {seq} of station database {chain:D} has no run in the same month.");
            }

            var ordinal = reader.ReadInt32();
            var name = Text(reader, "name");
            var value = reader.ReadNullableDouble() ?? double.NaN;
            var unit = Text(reader, "unit");
            var shape = new PackShape(name, unit, reader.ReadNullableDouble(), reader.ReadNullableDouble());
            if (!_shapeIndex.TryGetValue(shape, out var s))
            {
                s = _shapes.Count;
                _shapes.Add(shape);
                _shapeIndex.Add(shape, s);
            }

            _readings.Add((run, ordinal, s, value));
        }

        public RunPack Build()
        {
            // Runs in end and seq order, each run's readings in ordinal order.
            var order = Enumerable.Range(0, _runs.Count).OrderBy(i => _runs[i].Ticks).ThenBy(i => _runs[i].Seq).ToArray();
            var position = new int[order.Length];
            for (var p = 0; p < order.Length; p++)
            {
                position[order[p]] = p;
            }

            var readings = _readings.OrderBy(r => position[r.Run]).ThenBy(r => r.Ordinal).ToArray();
            var starts = new int[order.Length + 1];
            foreach (var reading in readings)
            {
                starts[position[reading.Run] + 1]++;
            }

            for (var p = 0; p < order.Length; p++)
            {
                starts[p + 1] += starts[p];
            }

            T[] Column<T>(Func<int, T> of) => order.Select(of).ToArray();
            return new RunPack
            {
                Chain = chain,
                Texts = [.. _texts],
                EndedTicks = Column(i => _runs[i].Ticks),
                Seq = Column(i => _runs[i].Seq),
                Station = Column(i => _runs[i].Station),
                Slot = Column(i => _runs[i].Slot),
                Lot = Column(i => _runs[i].Lot),
                Sequence = Column(i => _runs[i].Sequence),
                Revision = Column(i => _runs[i].Revision),
                Product = Column(i => _runs[i].Product),
                Operator = Column(i => _runs[i].Operator),
                Failure = Column(i => _runs[i].Failure),
                Reason = Column(i => _runs[i].Reason),
                Verdict = Column(i => _runs[i].Verdict),
                Serial = Column(i => _runs[i].Serial),
                Shapes = [.. _shapes],
                ReadingStart = starts,
                ReadingShape = readings.Select(r => r.Shape).ToArray(),
                ReadingValue = readings.Select(r => r.Value).ToArray(),
            };
        }

        private int Text(CopyBinaryReader reader, string column) =>
            Number(reader.ReadText(_cache) ?? throw Null(column, reader.Row));

        private int NullableText(CopyBinaryReader reader) => reader.ReadText(_cache) is { } text ? Number(text) : -1;

        private int Number(string text)
        {
            if (!_textIndex.TryGetValue(text, out var index))
            {
                index = _texts.Count;
                _texts.Add(text);
                _textIndex.Add(text, index);
            }

            return index;
        }

        private static InvalidDataException Null(string column, long row) => new($"Row {row}: column {column} is NULL, which the schema does not allow.");
    }
}

/// <summary>What a refresh of the packs did: packs written, runs in them, and how long it took.</summary>
internal readonly record struct PackRefresh(int Packs, long Runs, TimeSpan Elapsed);
