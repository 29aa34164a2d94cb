using System.Diagnostics;
using System.Globalization;
using LineTest.Core.Results;
using LineTest.Factory.Forwarding;
using LineTest.Factory.Schema;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging.Abstractions;
using Npgsql;

namespace LineTest.Station.Demo;

/// <summary>
/// The factory database's benchmarks: forwarding throughput from several stations at once, and a database of many
/// runs filled in SQL for the report benchmark, with the plain SQL aggregate that is the report's floor.
/// </summary>
public static class FactoryBench
{
    private static readonly string[] ReadingNames = ["supply.current", "cal.offset", "trim.gain", "verify.error", "verify.linearity"];

    /// <summary>
    /// Stores <paramref name="runsPerStation"/> runs of <paramref name="readingsPerRun"/> readings in each of
    /// <paramref name="stations"/> station folders under <paramref name="folder"/> (not timed), then forwards all stations
    /// at once and returns (runs, seconds).
    /// </summary>
    public static async Task<(long Runs, double Seconds)> ForwardingAsync(
        NpgsqlDataSource dataSource, string folder, int stations, int runsPerStation, int readingsPerRun, CancellationToken ct)
    {
        var directories = new List<string>();
        for (var k = 1; k <= stations; k++)
        {
            var station = string.Create(CultureInfo.InvariantCulture, $"ST-{k:D2}");
            var directory = Path.Combine(folder, station);
            directories.Add(directory);
            await using var store = SqliteResultStore.Open(directory);
            var start = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);
            for (var i = 0; i < runsPerStation; i++)
            {
                await store.AppendAsync(Run(station, k, i, start.AddMinutes(i * 4), readingsPerRun), ct).ConfigureAwait(false);
            }
        }

        var forwarder = new FactoryForwarder(dataSource, TimeProvider.System, NullLogger<FactoryForwarder>.Instance);
        await forwarder.EnsureReadyAsync(ct).ConfigureAwait(false);
        var watch = Stopwatch.StartNew();
        var results = await Task.WhenAll(directories.Select(async directory =>
        {
            await using var outbox = SqliteOutbox.Open(directory);
            return await forwarder.ForwardAsync(outbox, ct).ConfigureAwait(false);
        })).ConfigureAwait(false);
        watch.Stop();
        return (results.Sum(r => (long)r.Stored), watch.Elapsed.TotalSeconds);
    }

    /// <summary>
    /// Fills an empty factory database with <paramref name="runs"/> runs of 5 readings over 10 stations (20 s apart, so
    /// about eight monthly partitions for a million), in SQL; returns the seconds it took.
    /// </summary>
    public static async Task<double> FillAsync(NpgsqlDataSource dataSource, long runs, CancellationToken ct)
    {
        await FactoryMigrations.ApplyAsync(dataSource, ct).ConfigureAwait(false);
        var watch = Stopwatch.StartNew();
        await ExecuteAsync(dataSource, $$"""
            SELECT setseed(0.4040);
            SELECT linetest_ensure_month(t) FROM generate_series(timestamptz '2026-01-01 00:00Z', timestamptz '2026-01-01 00:00Z' + {{runs}} * interval '20 seconds', interval '1 month') t;
            SELECT linetest_ensure_month(timestamptz '2026-01-01 00:00Z' + {{runs}} * interval '20 seconds');
            INSERT INTO chains (chain_id, station, head_seq, head_sha256, runs)
            SELECT md5(s)::uuid, s, 0, '', 0 FROM (SELECT 'ST-' || lpad(k::text, 2, '0') AS s FROM generate_series(1, 10) k) x;
            INSERT INTO runs (ended_utc, ended_ticks, station, chain_id, station_seq, run_id, serial, verdict, started_utc, product,
                              sequence_id, sequence_revision, sequence_sha256, fixture, slot, lot, mode, reason, first_failing_reading,
                              reading_count, prev_sha256, record_sha256, run_json)
            SELECT t, (extract(epoch FROM t) * 10000000)::bigint + 621355968000000000, st, md5(st)::uuid, i / 10 + 1, gen_random_uuid(),
                   'CTP40A-2612-' || lpad(i::text, 7, '0'),
                   CASE WHEN i % 23 = 0 THEN 'fail' WHEN i % 97 = 0 THEN 'error' ELSE 'pass' END,
                   '', 'CTP-40A', 'ctp40a-dac', 1, '', 'DB4-A', i % 4 + 1, 'LOT-' || (i / 50000), 'engineering',
                   CASE WHEN i % 23 = 0 THEN 'verify.error outside limits' WHEN i % 97 = 0 THEN 'reference thermometer lost' END,
                   CASE WHEN i % 23 = 0 THEN 'verify.error' END, 5, '', '', '{}'
              FROM generate_series(0, {{runs - 1}}) i,
                   LATERAL (SELECT timestamptz '2026-01-01 00:00Z' + i * interval '20 seconds' AS t, 'ST-' || lpad((i % 10 + 1)::text, 2, '0') AS st) x;
            INSERT INTO readings (ended_utc, ended_ticks, station, chain_id, station_seq, ordinal, name, value, unit, low, high, verdict)
            SELECT r.ended_utc, r.ended_ticks, r.station, r.chain_id, r.station_seq, o,
                   (ARRAY['{{string.Join("','", ReadingNames)}}'])[o + 1],
                   (o + 1) * 0.1 + 0.02 * (random() + random() + random() - 1.5), 'V', (o + 1) * 0.1 - 0.05, (o + 1) * 0.1 + 0.05, 'pass'
              FROM runs r, generate_series(0, 4) o;
            ANALYZE runs; ANALYZE readings;
            """, ct).ConfigureAwait(false);
        return watch.Elapsed.TotalSeconds;
    }

    /// <summary>The floor: the plain SQL aggregates of yield and per-reading count, mean and standard deviation; seconds.</summary>
    public static async Task<double> FloorAsync(NpgsqlDataSource dataSource, CancellationToken ct)
    {
        var watch = Stopwatch.StartNew();
        await ExecuteAsync(dataSource, """
            SELECT verdict, count(*) FROM runs GROUP BY verdict;
            SELECT name, count(value), avg(value), stddev_samp(value), min(value), max(value) FROM readings GROUP BY name;
            """, ct).ConfigureAwait(false);
        return watch.Elapsed.TotalSeconds;
    }

    private static async Task ExecuteAsync(NpgsqlDataSource dataSource, string sql, CancellationToken ct)
    {
        await using var command = dataSource.CreateCommand(sql);
        command.CommandTimeout = 0;
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        do
        {
            while (await reader.ReadAsync(ct).ConfigureAwait(false))
            {
            }
        }
        while (await reader.NextResultAsync(ct).ConfigureAwait(false));
    }

    private static RunRecord Run(string station, int stationIndex, int i, DateTimeOffset started, int readings)
    {
        var fail = i % 23 == 7;
        var list = new List<Reading>(readings);
        for (var r = 0; r < readings; r++)
        {
            var value = 0.1 * (r + 1) + (0.001 * ((i * 7 + r * 13 + stationIndex) % 17));
            list.Add(new Reading(ReadingNames[r % ReadingNames.Length] + (r < ReadingNames.Length ? string.Empty : "." + r.ToString(CultureInfo.InvariantCulture)), value, "V", 0.1 * (r + 1) - 0.05, 0.1 * (r + 1) + 0.05, Verdict.Pass)
            {
                Step = "verify",
                Setpoint = "mid",
            });
        }

        return new RunRecord
        {
            Id = Guid.CreateVersion7(started),
            Serial = string.Create(CultureInfo.InvariantCulture, $"CTP40A-2612-{stationIndex * 100_000 + i:D6}"),
            Product = "CTP-40A",
            SequenceId = "ctp40a-dac",
            SequenceRevision = 1,
            SequenceSha256 = new string('a', 64),
            Station = station,
            Fixture = "DB4-A",
            Slot = 1 + (i % 4),
            Lot = "LOT-1",
            Mode = "engineering",
            StartedUtc = started,
            EndedUtc = started.AddMinutes(3),
            Verdict = fail ? Verdict.Fail : Verdict.Pass,
            Reason = fail ? "verify.error outside limits" : null,
            FirstFailingReading = fail ? "verify.error" : null,
            Readings = list,
        };
    }
}
