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
    /// Where the unit's output is read while soaking: <c>meter</c> (volts, the default) or <c>link</c> (raw ADC
    /// counts over the unit's link), see <see cref="UnitOutputs"/>.
    /// </summary>
    public string Output { get; init; } = UnitOutputs.Meter;

    /// <summary>
    /// Output sensitivity used to express a unit's drift in °C, volts per °C (output <c>meter</c>). Optional when the
    /// sequence's trim declares an analog target slope (that slope is used).
    /// </summary>
    public double? OutputVoltsPerC { get; init; }

    /// <summary>
    /// Raw sensitivity used to express a unit's drift in °C, ADC counts per °C (output <c>link</c>; required there).
    /// Only its size matters: a diode's counts fall as it warms.
    /// </summary>
    public double? OutputCountsPerC { get; init; }

    /// <summary>Give up (verdict error for the unit) when it has not followed after this long, seconds.</summary>
    public required double TimeoutSeconds { get; init; }
}
