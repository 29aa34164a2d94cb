using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// Brings the source to a setpoint and waits until it is stable, then lets the units soak.
/// All units of a batch settle together: they share one source.
/// </summary>
public sealed record SettleStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "settle";

    /// <summary>Name of a setpoint of the sequence.</summary>
    public required string Setpoint { get; init; }
}
