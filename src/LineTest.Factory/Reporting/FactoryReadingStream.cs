using System.Diagnostics;
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
    /// transaction on the same snapshot) at once; with <paramref name="times"/>, notes when the readings were read and
    /// placed (Stopwatch time since <paramref name="started"/>).
    /// </summary>
    public static async Task ReadAsync(
        IReadOnlyList<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> connections,
        ReportQuery query,
        RunIndex runs,
        IReadOnlyList<(DateTime From, DateTime To)> months,
        ReportData data,
        FactoryLoadTimes? times,
        long started,
        CancellationToken ct)
    {
        var parts = await Task.WhenAll(connections.Select((c, k) => Task.Run(
            async () =>
            {
                // One connection's buckets and texts across its months, so a name is one string and finds its bucket
                // by reference from the first month to the last.
                var part = new Dictionary<(string Sequence, string Name), SeriesBucket>();
                var texts = (Names: new CopyTextCache(), Units: new CopyTextCache());
                for (var m = k; m < months.Count; m += connections.Count)
                {
                    await ReadMonthAsync(c.Connection, query, months[m], runs, data.Runs, part, texts, ct).ConfigureAwait(false);
                }

                return part;
            },
            ct))).ConfigureAwait(false);
        if (times is not null)
        {
            times.ReadingsRead = Stopwatch.GetElapsedTime(started);
        }

        Fill(parts, data);
        if (times is not null)
        {
            times.ReadingsPlaced = Stopwatch.GetElapsedTime(started);
        }
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
        ReportQuery query,
        (DateTime From, DateTime To) month,
        RunIndex runs,
        RunTable table,
        Dictionary<(string Sequence, string Name), SeriesBucket> part,
        (CopyTextCache Names, CopyTextCache Units) texts,
        CancellationToken ct)
    {
        // Binary COPY, decoded in place: no object per reading (see CopyBinaryReader).
        var where = FactoryFilterSql.WhereLiteral(query, "g", runConditions: false, month);
        await using var reader = await CopyBinaryReader.StartAsync(
            connection,
            $"COPY (SELECT g.chain_id, g.station_seq, g.ordinal, g.name, g.value, g.unit, g.low, g.high FROM readings g{where}) TO STDOUT (FORMAT BINARY)",
            fields: 8,
            ct).ConfigureAwait(false);

        // Readings are analysed per (sequence, name), never pooled across products, as for station folders. A run's
        // readings come together, one of each name, so the few buckets used last are kept at hand; names and sequence
        // ids are shared strings, compared by reference.
        var recent = new SeriesBucket?[8];
        var chain = Guid.Empty;
        var chainNumber = -1L;
        while (await reader.NextRowAsync(ct).ConfigureAwait(false))
        {
            var chainId = reader.ReadGuid();
            if (chainId != chain || chainNumber < 0)
            {
                chain = chainId;
                chainNumber = runs.ChainNumber(chainId);
            }

            var run = runs.Find(chainNumber, reader.ReadInt64());
            if (run < 0)
            {
                // A reading of a run the run conditions (slot, lot, sequence) left out.
                continue;
            }

            var ordinal = reader.ReadInt32();
            if (ordinal < 0 || ordinal >= 1 << OrdinalBits)
            {
                throw new InvalidDataException($"Reading ordinal {ordinal} of run {run} is outside 0…2^{OrdinalBits}.");
            }

            var name = reader.ReadText(texts.Names) ?? throw new InvalidDataException($"Reading {ordinal} of run {run} has no name.");
            var value = reader.ReadNullableDouble() ?? double.NaN;
            var unit = reader.ReadText(texts.Units) ?? throw new InvalidDataException($"Reading {ordinal} of run {run} has no unit.");
            var low = reader.ReadNullableDouble();
            var high = reader.ReadNullableDouble();
            var sequence = table.SequenceId(run)!;
            var bucket = Recent(recent, sequence, name) ?? Remember(recent, part, sequence, name);
            bucket.Add(((long)run << OrdinalBits) | (uint)ordinal, value, new ReadingShape(name, unit, low, high));
        }
    }

    private static SeriesBucket? Recent(SeriesBucket?[] recent, string sequence, string name)
    {
        foreach (var bucket in recent)
        {
            if (bucket is not null && ReferenceEquals(bucket.Sequence, sequence) && ReferenceEquals(bucket.Name, name))
            {
                return bucket;
            }
        }

        return null;
    }

    private static SeriesBucket Remember(SeriesBucket?[] recent, Dictionary<(string Sequence, string Name), SeriesBucket> part, string sequence, string name)
    {
        if (!part.TryGetValue((sequence, name), out var bucket))
        {
            bucket = new SeriesBucket(sequence) { Name = name };
            part.Add((sequence, name), bucket);
        }

        Array.Copy(recent, 0, recent, 1, recent.Length - 1);
        recent[0] = bucket;
        return bucket;
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
