namespace LineTest.Core.Stability;

/// <summary>
/// A sliding window of timed readings that decides stability: over the last <see cref="WindowSeconds"/>,
/// every reading lies within ± band of the window's mean and the least-squares drift rate is below a limit.
/// The window is full only when its readings span the whole window length. To keep it spanning the window
/// when readings do not fall on exact multiples of the window (a meter whose reads take a varying time), the
/// newest reading at or before the window's start is kept as its first reading.
/// </summary>
public sealed class StabilityWindow
{
    // Tolerance on timestamps: times come from TimeSpan ticks (100 ns), so 1 ns only absorbs rounding.
    private const double TimeToleranceSeconds = 1e-9;

    private readonly Queue<(double Seconds, double Value)> _samples = new();
    private double _lastSeconds = double.NegativeInfinity;

    /// <summary>Creates a window.</summary>
    /// <param name="windowSeconds">Length of the window, seconds.</param>
    /// <param name="bandHalfWidth">Half-width of the allowed spread around the window mean (same unit as values).</param>
    /// <param name="maxDriftPerMinute">Largest allowed |slope| in value units per minute.</param>
    public StabilityWindow(double windowSeconds, double bandHalfWidth, double maxDriftPerMinute)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(windowSeconds);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(bandHalfWidth);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(maxDriftPerMinute);
        WindowSeconds = windowSeconds;
        BandHalfWidth = bandHalfWidth;
        MaxDriftPerMinute = maxDriftPerMinute;
    }

    /// <summary>Window length, seconds.</summary>
    public double WindowSeconds { get; }

    /// <summary>Allowed spread half-width.</summary>
    public double BandHalfWidth { get; }

    /// <summary>Allowed drift per minute.</summary>
    public double MaxDriftPerMinute { get; }

    /// <summary>Readings currently in the window.</summary>
    public int Count => _samples.Count;

    /// <summary>Adds a reading taken at <paramref name="seconds"/> (monotonic) and drops readings older than the window.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The time is not finite or runs backwards (a bug in the caller).</exception>
    public void Add(double seconds, double value)
    {
        if (!double.IsFinite(seconds))
        {
            throw new ArgumentOutOfRangeException(nameof(seconds), seconds, "The reading's time must be a finite number of seconds.");
        }

        if (seconds < _lastSeconds)
        {
            throw new ArgumentOutOfRangeException(nameof(seconds), "Readings must be added in time order.");
        }

        _samples.Enqueue((seconds, value));
        _lastSeconds = seconds;

        // Drop the oldest reading only while the next one still reaches back to the window's start, so the
        // readings kept always span the window once enough time has passed.
        var windowStart = seconds - WindowSeconds + TimeToleranceSeconds;
        while (_samples.Count > 1 && SecondOldest() <= windowStart)
        {
            _samples.Dequeue();
        }
    }

    /// <summary>Forgets every reading.</summary>
    public void Clear()
    {
        _samples.Clear();
        _lastSeconds = double.NegativeInfinity;
    }

    /// <summary>Evaluates the window now.</summary>
    public StabilityVerdict Evaluate()
    {
        if (_samples.Count < 3)
        {
            return new StabilityVerdict(false, null, null, null, "not enough readings yet");
        }

        var first = _samples.Peek().Seconds;
        var last = _lastSeconds;
        double n = _samples.Count, sumT = 0, sumV = 0;
        foreach (var (t, v) in _samples)
        {
            sumT += t - first;
            sumV += v;
        }

        var meanT = sumT / n;
        var mean = sumV / n;
        double sxx = 0, sxy = 0, maxDeviation = 0;
        foreach (var (t, v) in _samples)
        {
            var dt = t - first - meanT;
            sxx += dt * dt;
            sxy += dt * (v - mean);
            maxDeviation = Math.Max(maxDeviation, Math.Abs(v - mean));
        }

        var slopePerMinute = sxx > 0 ? sxy / sxx * 60.0 : 0.0;

        // A NaN or infinite reading (a failed conversion upstream) would make every comparison below false and
        // so pass as stable; it must never count as stable.
        if (!double.IsFinite(mean) || !double.IsFinite(maxDeviation) || !double.IsFinite(slopePerMinute))
        {
            return new StabilityVerdict(false, null, null, null, "a reading is not a finite number");
        }

        if (last - first < WindowSeconds - TimeToleranceSeconds)
        {
            return new StabilityVerdict(false, mean, slopePerMinute, maxDeviation, "window not yet full");
        }

        if (maxDeviation > BandHalfWidth)
        {
            return new StabilityVerdict(false, mean, slopePerMinute, maxDeviation, "readings outside the band");
        }

        if (Math.Abs(slopePerMinute) > MaxDriftPerMinute)
        {
            return new StabilityVerdict(false, mean, slopePerMinute, maxDeviation, "still drifting");
        }

        return new StabilityVerdict(true, mean, slopePerMinute, maxDeviation, "stable");
    }

    private double SecondOldest()
    {
        using var e = _samples.GetEnumerator();
        e.MoveNext();
        e.MoveNext();
        return e.Current.Seconds;
    }
}
