namespace LineTest.Core.Trims;

/// <summary>
/// The offset network of a resistor-trimmed unit: a reference voltage Vref fed through Ro into a summing
/// node with feedback Rfo adds Voff = Vref·Rfo/Ro to the output, after the gain stage. Ro is the
/// select-on-test part at <see cref="Position"/>.
/// </summary>
public sealed record ResistorOffsetNetwork
{
    /// <summary>Board position of Ro, e.g. <c>R8</c>.</summary>
    public required string Position { get; init; }

    /// <summary>Vref, volts; its sign is the only sign of offset the network can add.</summary>
    public required double ReferenceVolts { get; init; }

    /// <summary>Rfo, the summing stage's fixed feedback resistor, ohms.</summary>
    public required double FeedbackOhms { get; init; }

    /// <summary>Ro fitted while the unit was calibrated, ohms; null when the position was left open (Voff = 0).</summary>
    public double? FittedOhms { get; init; }

    /// <summary>Smallest value allowed at the position, ohms.</summary>
    public required double MinOhms { get; init; }

    /// <summary>Largest value allowed at the position, ohms.</summary>
    public required double MaxOhms { get; init; }

    /// <summary>Voff = Vref·Rfo/Ro (0 for an open position), volts.</summary>
    public double OffsetVoltsWith(double? roOhms) => roOhms is { } ro ? ReferenceVolts * FeedbackOhms / ro : 0.0;
}
