namespace LineTest.Core.Sequences;

/// <summary>
/// Once the source is stable, units soak at least <see cref="MinimumSeconds"/> and until each unit's own output
/// drifts less than <see cref="MaxDriftCPerMinute"/> (in °C of indicated temperature) over <see cref="WindowSeconds"/>.
/// </summary>
public sealed record SoakSettings
{
    /// <summary>Fixed minimum soak, seconds.</summary>
    public double MinimumSeconds { get; init; }

    /// <summary>Largest allowed drift of a unit's indicated temperature, °C per minute.</summary>
    public required double MaxDriftCPerMinute { get; init; }

    /// <summary>Length of the sliding window over a unit's readings, seconds.</summary>
    public required double WindowSeconds { get; init; }

    /// <summary>Interval between unit readings while soaking, seconds.</summary>
    public double SampleIntervalSeconds { get; init; } = 5;

    /// <summary>
    /// Output sensitivity used to express a unit's drift in °C, volts per °C. Optional when the sequence's trim
    /// declares a target slope (that slope is used).
    /// </summary>
    public double? OutputVoltsPerC { get; init; }

    /// <summary>Give up (verdict error for the unit) when it has not followed after this long, seconds.</summary>
    public required double TimeoutSeconds { get; init; }
}
