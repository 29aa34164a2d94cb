namespace LineTest.Core.Fixtures;

/// <summary>The temperature source of a fixture and its safe operating envelope.</summary>
public sealed record SourceDefinition
{
    /// <summary>dry-block, bath or chamber.</summary>
    public string Kind { get; init; } = "dry-block";

    /// <summary>Lowest setpoint the source may be asked for, °C. Every sequence setpoint must lie inside the safe range.</summary>
    public required double SafeMinC { get; init; }

    /// <summary>Highest setpoint the source may be asked for, °C.</summary>
    public required double SafeMaxC { get; init; }

    /// <summary>Temperature the source returns to on cancel, fault or shutdown, °C.</summary>
    public required double StandbyC { get; init; }

    /// <summary>Largest heating rate, °C per minute.</summary>
    public required double RampUpCPerMinute { get; init; }

    /// <summary>Largest cooling rate, °C per minute.</summary>
    public required double RampDownCPerMinute { get; init; }

    /// <summary>Time constant of the first-order approach to the setpoint once the ramp ends, seconds.</summary>
    public required double SettlingTimeConstantSeconds { get; init; }

    /// <summary>
    /// Largest difference between any slot's well and the reference well at a setpoint that the station does not correct,
    /// °C (half-width of a rectangular distribution, from the source's calibration: the whole well-to-well difference, or
    /// what is left of it when the slots state their <see cref="SlotDefinition.WellOffsetC"/>), or null when not stated.
    /// Enters the error budget over the rated range.
    /// </summary>
    public double? WellUniformityC { get; init; }

    /// <summary>Serial connection for a real source (ignored by the simulator).</summary>
    public PortDefinition? Port { get; init; }
}
