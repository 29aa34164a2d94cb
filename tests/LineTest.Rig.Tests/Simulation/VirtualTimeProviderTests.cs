using System.Collections.Concurrent;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class VirtualTimeProviderTests
{
    // Guards against a hang only; the assertions are on the virtual clock, never on wall time.
    private static readonly TimeSpan HangGuard = TimeSpan.FromSeconds(30);

    private static readonly DateTimeOffset Start = SimulatedFixtures.Start;

    [Fact]
    public void GetUtcNow_NewProvider_ReturnsStart()
    {
        var clock = new VirtualTimeProvider(Start);

        Assert.Equal(Start, clock.GetUtcNow());
        Assert.Equal(TimeZoneInfo.Utc, clock.LocalTimeZone);
    }

    [Fact]
    public async Task TaskDelay_EightHours_ClockShowsEightHoursLater()
    {
        var clock = new VirtualTimeProvider(Start);

        await Task.Delay(TimeSpan.FromHours(8), clock).WaitAsync(HangGuard);

        Assert.Equal(Start.AddHours(8), clock.GetUtcNow());
    }

    [Fact]
    public async Task TaskDelay_ManyDelaysInSequence_ClockIsTheirSum()
    {
        var clock = new VirtualTimeProvider(Start);

        for (var i = 1; i <= 200; i++)
        {
            await Task.Delay(TimeSpan.FromSeconds(i), clock).WaitAsync(HangGuard);
        }

        // 1 + 2 + … + 200 = 20 100 s.
        Assert.Equal(Start.AddSeconds(20_100), clock.GetUtcNow());
    }

    [Fact]
    public void GetElapsedTime_AfterAdvance_MatchesAdvance()
    {
        var clock = new VirtualTimeProvider(Start);
        var before = clock.GetTimestamp();

        clock.Advance(TimeSpan.FromMinutes(90.5));

        Assert.Equal(TimeSpan.FromMinutes(90.5), clock.GetElapsedTime(before));
        Assert.Equal(Start.AddMinutes(90.5), clock.GetUtcNow());
        Assert.Equal(TimeSpan.TicksPerSecond, clock.TimestampFrequency);
    }

    [Fact]
    public void Advance_Negative_Throws()
    {
        var clock = new VirtualTimeProvider(Start);

        Assert.Throws<ArgumentOutOfRangeException>(() => clock.Advance(TimeSpan.FromSeconds(-1)));
    }

    [Fact]
    public void CreateTimer_SeveralPending_FireInDueOrderWithClockAtDueTime()
    {
        var clock = new VirtualTimeProvider(Start) { AutoAdvance = false };
        var fired = new ConcurrentQueue<(int Id, DateTimeOffset At)>();
        using var done = new CountdownEvent(3);
        var timers = new[] { 30, 10, 20 }
            .Select(seconds => clock.CreateTimer(
                _ =>
                {
                    fired.Enqueue((seconds, clock.GetUtcNow()));
                    done.Signal();
                },
                null,
                TimeSpan.FromSeconds(seconds),
                Timeout.InfiniteTimeSpan))
            .ToList();

        clock.AutoAdvance = true;

        Assert.True(done.Wait(HangGuard));
        Assert.Equal([10, 20, 30], fired.Select(f => f.Id));
        Assert.Equal([Start.AddSeconds(10), Start.AddSeconds(20), Start.AddSeconds(30)], fired.Select(f => f.At));
        timers.ForEach(t => t.Dispose());
    }

    [Fact]
    public void Dispose_BeforeDue_TimerNeverFires()
    {
        var clock = new VirtualTimeProvider(Start) { AutoAdvance = false };
        var disposedFired = false;
        using var sentinel = new ManualResetEventSlim();
        var doomed = clock.CreateTimer(_ => disposedFired = true, null, TimeSpan.FromSeconds(5), Timeout.InfiniteTimeSpan);
        using var later = clock.CreateTimer(_ => sentinel.Set(), null, TimeSpan.FromSeconds(6), Timeout.InfiniteTimeSpan);

        doomed.Dispose();
        clock.Advance(TimeSpan.FromSeconds(10));

        // Timers fire one at a time in due order, so once the later one has fired the earlier one had its chance.
        Assert.True(sentinel.Wait(HangGuard));
        Assert.False(disposedFired);
        Assert.False(doomed.Change(TimeSpan.Zero, Timeout.InfiniteTimeSpan));
    }

    [Fact]
    public void Change_ToLaterDueTime_FiresAtNewTimeOnly()
    {
        var clock = new VirtualTimeProvider(Start) { AutoAdvance = false };
        var fireTimes = new ConcurrentQueue<DateTimeOffset>();
        using var fired = new SemaphoreSlim(0);
        using var timer = clock.CreateTimer(
            _ =>
            {
                fireTimes.Enqueue(clock.GetUtcNow());
                fired.Release();
            },
            null,
            TimeSpan.FromSeconds(10),
            Timeout.InfiniteTimeSpan);

        Assert.True(timer.Change(TimeSpan.FromSeconds(30), Timeout.InfiniteTimeSpan));
        clock.AutoAdvance = true;

        Assert.True(fired.Wait(HangGuard));
        Assert.Equal([Start.AddSeconds(30)], fireTimes);
        Assert.False(fired.Wait(TimeSpan.FromMilliseconds(50)));
    }

    [Fact]
    public void CreateTimer_Periodic_ReArmsAfterEachFireUntilDisposed()
    {
        var clock = new VirtualTimeProvider(Start);
        var fireTimes = new ConcurrentQueue<DateTimeOffset>();
        using var done = new ManualResetEventSlim();
        ITimer? timer = null;
        var gate = new object();
        lock (gate)
        {
            timer = clock.CreateTimer(
                _ =>
                {
                    lock (gate)
                    {
                        fireTimes.Enqueue(clock.GetUtcNow());
                        if (fireTimes.Count == 3)
                        {
                            timer!.Dispose();
                            done.Set();
                        }
                    }
                },
                null,
                TimeSpan.FromMinutes(1),
                TimeSpan.FromMinutes(5));
        }

        Assert.True(done.Wait(HangGuard));
        Assert.Equal([Start.AddMinutes(1), Start.AddMinutes(6), Start.AddMinutes(11)], fireTimes);
        Assert.Equal(Start.AddMinutes(11), clock.GetUtcNow());
    }

    [Fact]
    public void CreateTimer_ZeroPeriod_FiresOnce()
    {
        var clock = new VirtualTimeProvider(Start) { AutoAdvance = false };
        var count = 0;
        using var timer = clock.CreateTimer(_ => Interlocked.Increment(ref count), null, TimeSpan.FromSeconds(1), TimeSpan.Zero);
        using var sentinel = new ManualResetEventSlim();
        using var later = clock.CreateTimer(_ => sentinel.Set(), null, TimeSpan.FromMinutes(1), Timeout.InfiniteTimeSpan);
        clock.AutoAdvance = true;

        Assert.True(sentinel.Wait(HangGuard));
        Assert.Equal(1, Volatile.Read(ref count));
        Assert.Equal(Start.AddMinutes(1), clock.GetUtcNow());
    }

    [Fact]
    public void CreateTimer_InfiniteDueTime_NeverFires()
    {
        var clock = new VirtualTimeProvider(Start);
        var fired = false;
        using var timer = clock.CreateTimer(_ => fired = true, null, Timeout.InfiniteTimeSpan, Timeout.InfiniteTimeSpan);
        using var sentinel = new ManualResetEventSlim();
        using var other = clock.CreateTimer(_ => sentinel.Set(), null, TimeSpan.FromDays(3), Timeout.InfiniteTimeSpan);

        Assert.True(sentinel.Wait(HangGuard));
        Assert.False(fired);
        Assert.Equal(Start.AddDays(3), clock.GetUtcNow());
    }

    [Fact]
    public void CreateTimer_NegativeDueTime_Throws()
    {
        var clock = new VirtualTimeProvider(Start);

        Assert.Throws<ArgumentOutOfRangeException>(() => clock.CreateTimer(_ => { }, null, TimeSpan.FromSeconds(-2), Timeout.InfiniteTimeSpan));
    }

    [Fact]
    public async Task TaskDelay_Cancelled_EndsCancelledWithoutMovingClock()
    {
        var clock = new VirtualTimeProvider(Start) { AutoAdvance = false };
        using var cts = new CancellationTokenSource();
        var delay = Task.Delay(TimeSpan.FromHours(1), clock, cts.Token);

        await cts.CancelAsync();

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => delay.WaitAsync(HangGuard));
        Assert.Equal(Start, clock.GetUtcNow());
    }
}
