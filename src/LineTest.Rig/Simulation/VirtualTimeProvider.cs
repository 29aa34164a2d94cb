namespace LineTest.Rig.Simulation;

/// <summary>
/// Accelerated virtual time for the built-in simulator: a clock that only moves when something waits on it.
/// </summary>
/// <remarks>
/// <para>
/// <b>Single-flow assumption.</b> The station's fixture coordinator runs one logical flow of control: at any moment
/// it waits on at most one delay, and it checks timeouts by comparing elapsed time, never by arming a timer. Under
/// that assumption nothing else can happen "while" a delay runs, so the provider does not wait at all: each timer,
/// as soon as it is created (or re-armed with <see cref="ITimer.Change"/>), is fired by jumping the virtual clock
/// forward to its due time. <c>Task.Delay(TimeSpan.FromHours(8), provider)</c> therefore completes almost at once
/// in wall time with the clock 8 h later.
/// </para>
/// <para>
/// Consequences a caller must respect: a <see cref="CancellationTokenSource"/> created with a timeout on this
/// provider cancels at once (its timer fires immediately), so timeouts must be checked by elapsed time; a periodic
/// timer re-arms itself after each callback and keeps driving the clock forward until it is disposed, so the
/// station must not leave periodic timers running on this provider.
/// </para>
/// <para>
/// Timer callbacks run on the thread pool, one at a time, in due-time order (ties in order of arming); the clock
/// reads the callback's due time while it runs. The clock never moves backwards: a timer armed at a time already
/// past fires at the current time. With <see cref="AutoAdvance"/> off, timers wait for <see cref="Advance"/> like
/// a manual test clock, which lets tests observe <see cref="ITimer.Change"/> and <see cref="IDisposable.Dispose"/>.
/// </para>
/// </remarks>
public sealed class VirtualTimeProvider : TimeProvider
{
    // Concurrency: every field below is read and written only under _gate. Callbacks are invoked outside the lock.
    private readonly Lock _gate = new();
    private readonly PriorityQueue<VirtualTimer, (long DueTicks, long Sequence)> _pending = new();
    private readonly TimeZoneInfo _localTimeZone;
    private long _nowUtcTicks;
    private long _sequence;
    private bool _pumping;
    private bool _autoAdvance = true;

    /// <summary>Creates a virtual clock that starts at <paramref name="startUtc"/> and reports local time as UTC.</summary>
    public VirtualTimeProvider(DateTimeOffset startUtc)
        : this(startUtc, TimeZoneInfo.Utc)
    {
    }

    /// <summary>Creates a virtual clock that starts at <paramref name="startUtc"/>.</summary>
    /// <param name="startUtc">The first instant of virtual time.</param>
    /// <param name="localTimeZone">The time zone reported as local (kept fixed so runs are repeatable on any PC).</param>
    public VirtualTimeProvider(DateTimeOffset startUtc, TimeZoneInfo localTimeZone)
    {
        ArgumentNullException.ThrowIfNull(localTimeZone);
        _nowUtcTicks = startUtc.UtcTicks;
        _localTimeZone = localTimeZone;
    }

    /// <summary>
    /// When true (the default) each timer fires as soon as it is armed, the clock jumping to its due time.
    /// When false timers fire only as <see cref="Advance"/> moves the clock past their due time.
    /// </summary>
    public bool AutoAdvance
    {
        get
        {
            lock (_gate)
            {
                return _autoAdvance;
            }
        }

        set
        {
            lock (_gate)
            {
                _autoAdvance = value;
            }

            if (value)
            {
                StartPumpIfIdle();
            }
        }
    }

    /// <inheritdoc/>
    public override TimeZoneInfo LocalTimeZone => _localTimeZone;

    /// <summary>Timestamps count 100 ns ticks of virtual time.</summary>
    public override long TimestampFrequency => TimeSpan.TicksPerSecond;

    /// <inheritdoc/>
    public override DateTimeOffset GetUtcNow()
    {
        lock (_gate)
        {
            return new DateTimeOffset(_nowUtcTicks, TimeSpan.Zero);
        }
    }

    /// <summary>The virtual clock in ticks, consistent with <see cref="GetUtcNow"/> and <see cref="TimestampFrequency"/>.</summary>
    public override long GetTimestamp()
    {
        lock (_gate)
        {
            return _nowUtcTicks;
        }
    }

    /// <summary>
    /// Moves the clock forward by <paramref name="delta"/> and fires, in due-time order, every timer that falls due
    /// on the way (whatever <see cref="AutoAdvance"/> says). Returns after those callbacks were queued, not finished.
    /// </summary>
    public void Advance(TimeSpan delta)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(delta, TimeSpan.Zero);
        lock (_gate)
        {
            _nowUtcTicks = checked(_nowUtcTicks + delta.Ticks);
        }

        StartPumpIfIdle();
    }

    /// <summary>Arms a timer; see the remarks on the class for when it fires.</summary>
    public override ITimer CreateTimer(TimerCallback callback, object? state, TimeSpan dueTime, TimeSpan period)
    {
        ArgumentNullException.ThrowIfNull(callback);
        ValidatePeriod(dueTime, nameof(dueTime));
        ValidatePeriod(period, nameof(period));
        var timer = new VirtualTimer(this, callback, state);
        timer.Change(dueTime, period);
        return timer;
    }

    private static void ValidatePeriod(TimeSpan value, string name)
    {
        if (value < TimeSpan.Zero && value != Timeout.InfiniteTimeSpan)
        {
            throw new ArgumentOutOfRangeException(name, value, "A timer time must be zero or more, or Timeout.InfiniteTimeSpan.");
        }
    }

    // Called by VirtualTimer.Change under no lock: records the new schedule and starts the pump.
    private bool Arm(VirtualTimer timer, TimeSpan dueTime, TimeSpan period)
    {
        ValidatePeriod(dueTime, nameof(dueTime));
        ValidatePeriod(period, nameof(period));
        lock (_gate)
        {
            if (timer.Disposed)
            {
                return false;
            }

            timer.Generation++;

            // As with System.Threading.Timer, a zero period means "fire once".
            timer.Period = period == TimeSpan.Zero ? Timeout.InfiniteTimeSpan : period;
            timer.ScheduledSequence = -1;
            if (dueTime != Timeout.InfiniteTimeSpan)
            {
                Schedule(timer, checked(_nowUtcTicks + dueTime.Ticks));
            }
        }

        StartPumpIfIdle();
        return true;
    }

    private void Disarm(VirtualTimer timer)
    {
        lock (_gate)
        {
            timer.Disposed = true;
            timer.Generation++;
            timer.ScheduledSequence = -1;
        }
    }

    private void StartPumpIfIdle()
    {
        lock (_gate)
        {
            if (_pumping || _pending.Count == 0)
            {
                return;
            }

            _pumping = true;
        }

        ThreadPool.UnsafeQueueUserWorkItem(static self => self.Pump(), this, preferLocal: false);
    }

    // Fires due timers one at a time so that callbacks see a clock that matches their due time.
    private void Pump()
    {
        while (true)
        {
            VirtualTimer timer;
            long generation;
            lock (_gate)
            {
                if (!TryTakeNextDue(out timer, out generation))
                {
                    _pumping = false;
                    return;
                }
            }

            timer.Callback(timer.State);

            lock (_gate)
            {
                // A periodic timer re-arms after its callback unless the callback changed or disposed it.
                if (!timer.Disposed && timer.Generation == generation && timer.Period != Timeout.InfiniteTimeSpan)
                {
                    Schedule(timer, checked(_nowUtcTicks + timer.Period.Ticks));
                }
            }
        }
    }

    // Under _gate: queues one firing; older entries of the same timer become stale.
    private void Schedule(VirtualTimer timer, long dueTicks)
    {
        var sequence = _sequence++;
        timer.ScheduledSequence = sequence;
        _pending.Enqueue(timer, (dueTicks, sequence));
    }

    // Under _gate: drops stale entries, takes the earliest live timer that may fire now and moves the clock to it.
    private bool TryTakeNextDue(out VirtualTimer timer, out long generation)
    {
        while (_pending.TryPeek(out var candidate, out var key))
        {
            if (candidate.Disposed || candidate.ScheduledSequence != key.Sequence)
            {
                _pending.Dequeue();
                continue;
            }

            if (!_autoAdvance && key.DueTicks > _nowUtcTicks)
            {
                break;
            }

            _pending.Dequeue();
            _nowUtcTicks = Math.Max(_nowUtcTicks, key.DueTicks);
            candidate.ScheduledSequence = -1;
            timer = candidate;
            generation = candidate.Generation;
            return true;
        }

        timer = null!;
        generation = 0;
        return false;
    }

    /// <summary>A timer of this provider. Its mutable fields are guarded by the provider's lock.</summary>
    private sealed class VirtualTimer(VirtualTimeProvider owner, TimerCallback callback, object? state) : ITimer
    {
        public TimerCallback Callback { get; } = callback;

        public object? State { get; } = state;

        public TimeSpan Period { get; set; } = Timeout.InfiniteTimeSpan;

        public long Generation { get; set; }

        // Sequence number of the queue entry that is this timer's live firing, or -1 when none is queued.
        public long ScheduledSequence { get; set; } = -1;

        public bool Disposed { get; set; }

        public bool Change(TimeSpan dueTime, TimeSpan period) => owner.Arm(this, dueTime, period);

        public void Dispose() => owner.Disarm(this);

        public ValueTask DisposeAsync()
        {
            Dispose();
            return ValueTask.CompletedTask;
        }
    }
}
