namespace LineTest.Station.Hosting;

/// <summary>
/// A clock that runs <see cref="Speed"/> times faster than the wall clock, for watching the simulated station live
/// (a 40-minute batch in 40 seconds at speed 60). Timers fire after their due time divided by the speed.
/// </summary>
public sealed class ScaledTimeProvider : TimeProvider
{
    private readonly TimeProvider _wall;
    private readonly long _startTimestamp;
    private readonly DateTimeOffset _startUtc;

    /// <summary>Creates a clock starting now, <paramref name="speed"/> times faster than <paramref name="wall"/>.</summary>
    public ScaledTimeProvider(double speed, TimeProvider? wall = null)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(speed);
        Speed = speed;
        _wall = wall ?? System;
        _startTimestamp = _wall.GetTimestamp();
        _startUtc = _wall.GetUtcNow();
    }

    /// <summary>How many times faster than real time.</summary>
    public double Speed { get; }

    /// <inheritdoc />
    public override DateTimeOffset GetUtcNow() => _startUtc + _wall.GetElapsedTime(_startTimestamp) * Speed;

    /// <inheritdoc />
    public override long TimestampFrequency => TimeSpan.TicksPerSecond;

    /// <inheritdoc />
    public override long GetTimestamp() => (GetUtcNow() - _startUtc).Ticks;

    /// <inheritdoc />
    public override ITimer CreateTimer(TimerCallback callback, object? state, TimeSpan dueTime, TimeSpan period) =>
        _wall.CreateTimer(callback, state, Scale(dueTime), Scale(period));

    private TimeSpan Scale(TimeSpan span) =>
        span == Timeout.InfiniteTimeSpan ? span : TimeSpan.FromTicks((long)(span.Ticks / Speed));
}
