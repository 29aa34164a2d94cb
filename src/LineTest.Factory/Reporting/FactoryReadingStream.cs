using LineTest.Reports.Loading;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Streams the readings of the loaded runs into their series. The readings are read unordered (a plain scan, month
/// partitions on several connections at once), which costs the server a fraction of a scan in run order; each reading
/// finds its run in the <see cref="RunIndex"/>, and the client puts each series into run and reading order with one
/// sort. The series are then filled reading by reading in that order, exactly as a stream in run order would fill
/// them, so unit and limit changes, missing values and the series' order of first appearance are the same.
/// </summary>
internal static class FactoryReadingStream
{
    /// <summary>Readings per run are numbered below this (the sort key keeps the run above it).</summary>
    private const int OrdinalBits = 24;

    /// <summary>
    /// Adds every reading of the runs in <paramref name="runs"/> to <paramref name="data"/>'s series, reading the
    /// <paramref name="months"/> (those of the runs, from <see cref="Months"/>) on the given connections (each in a
    /// transaction on the same snapshot) at once.
    /// </summary>
    public static async Task ReadAsync(
        IReadOnlyList<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> connections,
        ReportQuery query,
        RunIndex runs,
        IReadOnlyList<(DateTime From, DateTime To)> months,
        ReportData data,
        CancellationToken ct)
    {
        var parts = await Task.WhenAll(connections.Select((c, k) => Task.Run(
            async () =>
            {
                var part = new Dictionary<(string Sequence, string Name), SeriesBucket>();
                for (var m = k; m < months.Count; m += connections.Count)
                {
                    await ReadMonthAsync(c.Connection, c.Transaction, query, months[m], runs, data.Runs, part, ct).ConfigureAwait(false);
                }

                return part;
            },
            ct))).ConfigureAwait(false);
        Fill(parts, data);
    }

    /// <summary>UTC month starts covering [first, last] ticks: each month is one partition of <c>readings</c>.</summary>
    public static List<(DateTime From, DateTime To)> Months(long firstTicks, long lastTicks)
    {
        var months = new List<(DateTime, DateTime)>();
        var last = new DateTime(lastTicks, DateTimeKind.Utc);
        for (var from = new DateTime(new DateTime(firstTicks, DateTimeKind.Utc).Year, new DateTime(firstTicks, DateTimeKind.Utc).Month, 1, 0, 0, 0, DateTimeKind.Utc);
             from <= last;
             from = from.AddMonths(1))
        {
            months.Add((from, from.AddMonths(1)));
        }

        return months;
    }

    private static async Task ReadMonthAsync(
        NpgsqlConnection connection,
        NpgsqlTransaction transaction,
        ReportQuery query,
        (DateTime From, DateTime To) month,
        RunIndex runs,
        RunTable table,
        Dictionary<(string Sequence, string Name), SeriesBucket> part,
        CancellationToken ct)
    {
        await using var command = new NpgsqlCommand(string.Empty, connection, transaction) { CommandTimeout = 0 };
        var where = FactoryFilterSql.Where(query, "g", command, runConditions: false, month);
        command.CommandText = $"""
            SELECT g.chain_id, g.station_seq, g.ordinal, g.name, g.value, g.unit, g.low, g.high
              FROM readings g{where};
            """;
        await using var reader = await command.ExecuteReaderAsync(System.Data.CommandBehavior.SequentialAccess, ct).ConfigureAwait(false);

        // Readings are analysed per (sequence, name), never pooled across products, as for station folders. A run's
        // readings usually come together, so the last bucket is kept at hand.
        SeriesBucket? bucket = null;
        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            var run = runs.Find(reader.GetGuid(0), reader.GetInt64(1));
            if (run < 0)
            {
                // A reading of a run the run conditions (slot, lot, sequence) left out.
                continue;
            }

            var ordinal = reader.GetInt32(2);
            if (ordinal < 0 || ordinal >= 1 << OrdinalBits)
            {
                throw new InvalidDataException($"Reading ordinal {ordinal} of run {run} is outside 0…2^{OrdinalBits}.");
            }

            var name = reader.GetString(3);
            var value = reader.IsDBNull(4) ? double.NaN : reader.GetDouble(4);
            var unit = reader.GetString(5);
            double? low = reader.IsDBNull(6) ? null : reader.GetDouble(6);
            double? high = reader.IsDBNull(7) ? null : reader.GetDouble(7);
            var sequence = table.SequenceId(run)!;
            if (bucket is null || !ReferenceEquals(bucket.Sequence, sequence) || !string.Equals(bucket.Name, name, StringComparison.Ordinal))
            {
                if (!part.TryGetValue((sequence, name), out bucket))
                {
                    bucket = new SeriesBucket(sequence) { Name = name };
                    part.Add((sequence, name), bucket);
                }
            }

            bucket.Add(((long)run << OrdinalBits) | (uint)ordinal, value, new ReadingShape(name, unit, low, high));
        }
    }

    /// <summary>Merges the parts' buckets per (sequence, name), sorts each into run and reading order and fills the series.</summary>
    private static void Fill(Dictionary<(string Sequence, string Name), SeriesBucket>[] parts, ReportData data)
    {
        var buckets = new Dictionary<(string Sequence, string Name), SeriesBucket>();
        foreach (var part in parts)
        {
            foreach (var (key, bucket) in part)
            {
                if (buckets.TryGetValue(key, out var into))
                {
                    into.Absorb(bucket);
                }
                else
                {
                    buckets.Add(key, bucket);
                }
            }
        }

        // Series in order of their first reading, as a stream in run order creates them.
        var sorted = buckets.Values.ToArray();
        Parallel.ForEach(sorted, bucket => bucket.Sort());
        foreach (var bucket in sorted.OrderBy(b => b.FirstKey))
        {
            var series = data.Series(bucket.Sequence, bucket.FirstShape.Name, bucket.FirstShape.Unit);
            bucket.FillInto(series, OrdinalBits);
        }
    }
}
