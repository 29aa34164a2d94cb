namespace LineTest.Core.Sequences;

/// <summary>
/// The source is stable when, over the last <see cref="WindowSeconds"/>, every reference reading lies within
/// ± <see cref="BandC"/> of the setpoint and the least-squares drift rate is below <see cref="MaxDriftCPerMinute"/>.
/// </summary>
public sealed record StabilitySettings
{
    /// <summary>Half-width of the band around the setpoint, °C.</summary>
    public required double BandC { get; init; }

    /// <summary>Largest allowed drift of the reference over the window, °C per minute.</summary>
    public required double MaxDriftCPerMinute { get; init; }

    /// <summary>Length of the sliding window, seconds.</summary>
    public required double WindowSeconds { get; init; }

    /// <summary>Interval between reference readings while waiting, seconds.</summary>
    public double SampleIntervalSeconds { get; init; } = 5;

    /// <summary>
    /// Largest allowed difference between the window's mean reference temperature and the setpoint, °C.
    /// A source's own control sensor and the reference never agree exactly, so stability is judged around the
    /// reference's own mean; this bound catches a source that settled somewhere else.
    /// </summary>
    public double MaxOffsetFromSetpointC { get; init; } = 1.0;

    /// <summary>Give up (verdict error) when not stable after this long, seconds.</summary>
    public required double TimeoutSeconds { get; init; }
}
