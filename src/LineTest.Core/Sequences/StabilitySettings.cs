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

    /// <summary>Give up (verdict error) when not stable after this long, seconds.</summary>
    public required double TimeoutSeconds { get; init; }
}
