using LineTest.Factory.Forwarding;
using LineTest.Factory.Tests.Support;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Factory.Tests.Forwarding;

public sealed class StationForwardingLoopTests
{
    private static readonly DateTimeOffset Start = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    private static FactoryForwardingOptions Quick => new()
    {
        PollInterval = TimeSpan.FromMilliseconds(50),
        RetryDelay = TimeSpan.FromMilliseconds(50),
        MaxRetryDelay = TimeSpan.FromMilliseconds(400),
        BatchSize = 5,
    };

    [ServerFact]
    public async Task RunAsync_ServerStoppedMidShiftAndStartedAgain_EveryRunArrivesOnceInOrderAndBacklogShown()
    {
        await using var server = await ThrowawayServer.StartAsync();
        await using var database = await TestDatabase.CreateAsync(server.ConnectionString);
        var stations = new[] { "ST-01", "ST-02", "ST-03" }.Select(s => new StationFolder(s, Start)).ToList();
        var forwarder = new FactoryForwarder(database.DataSource, TimeProvider.System, NullLogger<FactoryForwarder>.Instance, Quick.BatchSize);
        var loops = stations.Select(s => new StationForwardingLoop(s.Directory, forwarder, Quick, TimeProvider.System, NullLogger<StationForwardingLoop>.Instance)).ToList();
        using var stop = new CancellationTokenSource();
        var running = loops.Select(l => Task.Run(() => l.RunAsync(stop.Token))).ToList();
        try
        {
            foreach (var station in stations)
            {
                await station.AddRunsAsync(12);
            }

            await WaitUntil(() => loops.All(l => l.Current is { Count: 0, LastForwardedUtc: not null }), "the first runs to be forwarded");

            // The server goes away mid-shift; the stations go on testing and storing.
            await server.StopAsync();
            foreach (var station in stations)
            {
                await station.AddRunsAsync(17);
            }

            await WaitUntil(() => loops.All(l => l.Current is { Count: 17, Problem: not null, FailedAttempts: > 0 }), "the backlog to be shown");
            var shown = loops[0].Current;
            Assert.Equal(stations[0].Stored[12].EndedUtc, shown.OldestEndedUtc);
            Assert.Contains("17 run(s) waiting", shown.Describe(), StringComparison.Ordinal);

            await server.StartAgainAsync();
            await WaitUntil(() => loops.All(l => l.Current is { Count: 0, Problem: null }), "the backlog to drain");

            foreach (var station in stations)
            {
                Assert.Equal(Enumerable.Range(1, 29).Select(i => (long)i), await Support.Factory.SeqsAsync(database, station.Station));
                await using var outbox = SqliteOutbox.Open(station.Directory);
                var factoryId = await forwarder.EnsureReadyAsync();
                Assert.Equal(29L, (await outbox.ReadBacklogAsync(factoryId)).ForwardedThroughSeq);
            }

            Assert.Equal(87L, await database.ScalarAsync<long>("SELECT count(*) FROM run_ids;"));
            Assert.Equal(0L, await database.ScalarAsync<long>("SELECT count(*) FROM alarms;"));
            // In order: every accepted run continued its chain's head, so each chain's head is the station's last run.
            Assert.Equal(3L, await database.ScalarAsync<long>("SELECT count(*) FROM chains WHERE head_seq = 29 AND runs = 29;"));
        }
        finally
        {
            await stop.CancelAsync();
            await Task.WhenAll(running);
            foreach (var loop in loops)
            {
                await loop.DisposeAsync();
            }

            foreach (var station in stations)
            {
                await station.DisposeAsync();
            }
        }
    }

    [Fact]
    public async Task RunAsync_ServerUnreachable_LogsTheBacklogCountAndOldestRunAndTheScreenSeesThem()
    {
        // Nothing listens on port 1 of the loopback: every attempt is refused at once.
        await using var dataSource = global::LineTest.Factory.Schema.FactoryConnection.Create("Host=127.0.0.1;Port=1;Username=postgres;Database=none;Timeout=2");
        await using var station = new StationFolder("ST-07", Start);
        await station.AddRunsAsync(4);
        var logger = new RecordingLogger<StationForwardingLoop>();
        var forwarder = new FactoryForwarder(dataSource, TimeProvider.System, NullLogger<FactoryForwarder>.Instance, Quick.BatchSize);
        await using var loop = new StationForwardingLoop(station.Directory, forwarder, Quick, TimeProvider.System, logger);
        using var stop = new CancellationTokenSource();
        var running = Task.Run(() => loop.RunAsync(stop.Token));
        try
        {
            await WaitUntil(() => logger.Events.Any(e => e.Id.Id == 3010), "the outage to be logged");
        }
        finally
        {
            await stop.CancelAsync();
            await running;
        }

        var logged = logger.Events.First(e => e.Id.Id == 3010);
        Assert.Equal(Microsoft.Extensions.Logging.LogLevel.Warning, logged.Level);
        var oldest = station.Stored[0].EndedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss", System.Globalization.CultureInfo.InvariantCulture);
        Assert.Contains($"4 run(s) waiting, the oldest ended {oldest} UTC", logged.Message, StringComparison.Ordinal);
        Assert.Equal(4, loop.Current.Count);
        Assert.Equal(station.Stored[0].EndedUtc, loop.Current.OldestEndedUtc);
        Assert.NotNull(loop.Current.Problem);
    }

    private static async Task WaitUntil(Func<bool> condition, string what)
    {
        // Waits on a real server process, so real time; bounded so a regression fails instead of hanging.
        var deadline = TimeProvider.System.GetTimestamp();
        while (!condition())
        {
            if (TimeProvider.System.GetElapsedTime(deadline) > TimeSpan.FromSeconds(45))
            {
                Assert.Fail($"Timed out waiting for {what}.");
            }

            await Task.Delay(25);
        }
    }
}
