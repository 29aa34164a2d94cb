using LineTest.Factory.Tests.Support;
using LineTest.Storage.Chain;
using LineTest.Storage.Sqlite;

namespace LineTest.Factory.Tests.Forwarding;

public sealed class FactoryForwarderTests
{
    private static readonly DateTimeOffset Start = new(2026, 1, 31, 20, 0, 0, TimeSpan.Zero);

    [PostgresFact]
    public async Task ForwardAsync_ThreeStationsAtOnceWhileTesting_EveryRunOnceInSeqOrder()
    {
        await using var database = await TestDatabase.CreateAsync();
        var forwarder = Support.Factory.Forwarder(database, batchSize: 7);
        var stations = new[] { "ST-01", "ST-02", "ST-03" }.Select(s => new StationFolder(s, Start)).ToList();
        try
        {
            // Each station stores runs (across a month boundary) while its forwarder runs: three at once.
            await Task.WhenAll(stations.Select(async station =>
            {
                await using var outbox = SqliteOutbox.Open(station.Directory);
                for (var round = 0; round < 4; round++)
                {
                    await station.AddRunsAsync(9);
                    await forwarder.ForwardAsync(outbox);
                }
            }));

            foreach (var station in stations)
            {
                Assert.Equal(Enumerable.Range(1, 36).Select(i => (long)i), await Support.Factory.SeqsAsync(database, station.Station));
            }

            Assert.Equal(108L, await database.ScalarAsync<long>("SELECT count(*) FROM run_ids;"));
            Assert.Equal(
                stations.Sum(s => s.Stored.Sum(r => (long)r.Readings.Count)),
                await database.ScalarAsync<long>("SELECT count(*) FROM readings;"));
            Assert.Equal(0L, await database.ScalarAsync<long>("SELECT count(*) FROM alarms;"));
            // 20 min apart from 31 January 20:00: runs of January and of February, each in its month's partition.
            Assert.Equal(2L, await database.ScalarAsync<long>("SELECT count(*) FROM pg_inherits WHERE inhparent = 'runs'::regclass;"));
            Assert.True(await database.ScalarAsync<long>("SELECT count(*) FROM runs_2026m02;") > 0);
        }
        finally
        {
            foreach (var station in stations)
            {
                await station.DisposeAsync();
            }
        }
    }

    [PostgresFact]
    public async Task ForwardAsync_SameRunsForwardedAgain_StoredOnce()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var station = new StationFolder("ST-01", Start);
        await station.AddRunsAsync(5);
        var forwarder = Support.Factory.Forwarder(database);
        var first = await Support.Factory.ForwardAsync(forwarder, station.Directory);

        // The watermark lost (e.g. the station's disk restored from a backup): everything goes again.
        station.Execute("DELETE FROM outbox_forwarded;");
        var again = await Support.Factory.ForwardAsync(forwarder, station.Directory);

        Assert.Equal(new ForwardResultView(5, 0, 0), new ForwardResultView(first.Stored, first.Duplicates, first.Refused));
        Assert.Equal(new ForwardResultView(0, 5, 0), new ForwardResultView(again.Stored, again.Duplicates, again.Refused));
        Assert.Equal(5L, await database.ScalarAsync<long>("SELECT count(*) FROM runs;"));
        Assert.Equal(0L, await database.ScalarAsync<long>("SELECT count(*) FROM alarms;"));
    }

    [PostgresFact]
    public async Task ForwardAsync_ForwardedRunEditedAndChainRecomputed_RefusedAsAlarmAndServerCopyKept()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var station = new StationFolder("ST-01", Start);
        await station.AddRunsAsync(4);
        var forwarder = Support.Factory.Forwarder(database);
        await Support.Factory.ForwardAsync(forwarder, station.Directory);
        var original = await database.ScalarAsync<string>("SELECT record_sha256 FROM runs WHERE station_seq = 3;");

        // An intruder turns run 3 into a pass on the station, recomputes every later hash so the station's own
        // chain looks whole again, and has it all forwarded once more.
        station.Execute("UPDATE runs SET run_json = replace(run_json, '\"verdict\": \"fail\"', '\"verdict\": \"pass\"') || ' ' WHERE seq = 3;");
        RecomputeChain(station);
        station.Execute("DELETE FROM outbox_forwarded;");
        var result = await Support.Factory.ForwardAsync(forwarder, station.Directory);

        Assert.Equal(2, result.Refused); // run 3 and run 4, whose record hash changed with the chain
        Assert.Equal(2, result.Duplicates);
        Assert.Equal(original, await database.ScalarAsync<string>("SELECT record_sha256 FROM runs WHERE station_seq = 3;"));
        Assert.Equal(2L, await database.ScalarAsync<long>("SELECT count(*) FROM alarms WHERE kind = 'changed-record';"));
        Assert.Equal(original, await database.ScalarAsync<string>("SELECT stored_sha256 FROM alarms WHERE station_seq = 3;"));
    }

    [PostgresFact]
    public async Task ForwardAsync_RunEditedBeforeForwarding_RefusedAsBadRecordHash()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var station = new StationFolder("ST-01", Start);
        await station.AddRunsAsync(3);
        station.Execute("UPDATE runs SET run_json = replace(run_json, 'CTP40', 'CTP41') WHERE seq = 3;");

        var result = await Support.Factory.ForwardAsync(Support.Factory.Forwarder(database), station.Directory);

        Assert.Equal((2, 1), (result.Stored, result.Refused));
        Assert.Equal([1L, 2L], await Support.Factory.SeqsAsync(database, "ST-01"));
        Assert.Equal("bad-record-hash", await database.ScalarAsync<string>("SELECT kind FROM alarms;"));
    }

    [PostgresFact]
    public async Task ForwardAsync_ForgedRunNotContinuingTheChain_RefusedAsChainBreak()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var station = new StationFolder("ST-01", Start);
        await station.AddRunsAsync(3);
        var forwarder = Support.Factory.Forwarder(database);
        await Support.Factory.ForwardAsync(forwarder, station.Directory);

        // A forged run with a correct hash of its own text, but linked to genesis instead of the chain's head.
        await station.AddRunsAsync(1);
        var forgedPrev = RecordHash.Genesis;
        station.Execute($"UPDATE runs SET prev_sha256 = '{forgedPrev}' WHERE seq = 4;");
        RecomputeRecordOnly(station, 4);
        var result = await Support.Factory.ForwardAsync(forwarder, station.Directory);

        Assert.Equal((0, 1), (result.Stored, result.Refused));
        Assert.Equal("chain-break", await database.ScalarAsync<string>("SELECT kind FROM alarms;"));
        Assert.Equal(3L, await database.ScalarAsync<long>("SELECT head_seq FROM chains;"));
    }

    private static void RecomputeChain(StationFolder station)
    {
        using var connection = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={ResultsDatabase.PathIn(station.Directory)};Pooling=False");
        connection.Open();
        var rows = new List<(long Seq, string Json)>();
        using (var read = connection.CreateCommand())
        {
            read.CommandText = "SELECT seq, run_json FROM runs ORDER BY seq;";
            using var reader = read.ExecuteReader();
            while (reader.Read())
            {
                rows.Add((reader.GetInt64(0), reader.GetString(1)));
            }
        }

        var previous = RecordHash.Genesis;
        foreach (var (seq, json) in rows)
        {
            var record = RecordHash.Compute(json, previous);
            using var write = connection.CreateCommand();
            write.CommandText = "UPDATE runs SET prev_sha256 = $p, record_sha256 = $r WHERE seq = $s;";
            write.Parameters.AddWithValue("$p", previous);
            write.Parameters.AddWithValue("$r", record);
            write.Parameters.AddWithValue("$s", seq);
            write.ExecuteNonQuery();
            previous = record;
        }
    }

    private static void RecomputeRecordOnly(StationFolder station, long seq)
    {
        using var connection = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={ResultsDatabase.PathIn(station.Directory)};Pooling=False");
        connection.Open();
        using var read = connection.CreateCommand();
        read.CommandText = $"SELECT run_json, prev_sha256 FROM runs WHERE seq = {seq};";
        string json, prev;
        using (var reader = read.ExecuteReader())
        {
            reader.Read();
            json = reader.GetString(0);
            prev = reader.GetString(1);
        }

        using var write = connection.CreateCommand();
        write.CommandText = $"UPDATE runs SET record_sha256 = '{RecordHash.Compute(json, prev)}' WHERE seq = {seq};";
        write.ExecuteNonQuery();
    }

    private readonly record struct ForwardResultView(int Stored, int Duplicates, int Refused);
}
