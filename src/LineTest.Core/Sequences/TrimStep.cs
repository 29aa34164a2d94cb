using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// Computes the trim from the calibration points of the named setpoints (method in the sequence's <c>trim</c>),
/// range-checks it, writes it to the unit, stores it and reads it back.
/// </summary>
public sealed record TrimStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "trim";

    /// <summary>
    /// Setpoints whose measure steps supply the calibration points (two or more). A DAC or resistor trim takes two, or
    /// three: the outer two for the line, the inner one to measure the unit's own curvature (needs the sensor model).
    /// </summary>
    public required IReadOnlyList<string> Points { get; init; }

    /// <summary>Further setpoints to predict the remaining error at (e.g. the verify setpoint).</summary>
    public IReadOnlyList<string> PredictAt { get; init; } = [];
}
