namespace LineTest.Core.Trims;

/// <summary>
/// The gain stage of a resistor-trimmed unit: a non-inverting amplifier with gain G = 1 + Rf/Rg, where
/// Rg is the select-on-test part at <see cref="Position"/>.
/// </summary>
public sealed record ResistorGainNetwork
{
    /// <summary>Board position of Rg, e.g. <c>R7</c>.</summary>
    public required string Position { get; init; }

    /// <summary>Rf, the fixed feedback resistor, ohms.</summary>
    public required double FeedbackOhms { get; init; }

    /// <summary>
    /// Rg fitted while the unit was calibrated (a precision or measured part), ohms; null when the position
    /// was left open (G = 1).
    /// </summary>
    public double? FittedOhms { get; init; }

    /// <summary>Smallest value allowed at the position, ohms.</summary>
    public required double MinOhms { get; init; }

    /// <summary>Largest value allowed at the position, ohms.</summary>
    public required double MaxOhms { get; init; }

    /// <summary>G = 1 + Rf/Rg (G = 1 for an open position).</summary>
    public double GainWith(double? rgOhms) => rgOhms is { } rg ? 1.0 + (FeedbackOhms / rg) : 1.0;
}
