using LineTest.Core.Decisions;
using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// After trimming, reads the reference and the unit at a check setpoint and judges the unit's indicated
/// temperature error (indicated − reference, °C) against limits.
/// </summary>
public sealed record VerifyStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "verify";

    /// <summary>The setpoint the source must be settled at.</summary>
    public required string Setpoint { get; init; }

    /// <summary>Readings averaged.</summary>
    public int Samples { get; init; } = 10;

    /// <summary>Limits on the indicated error (unit degC or K).</summary>
    public required LimitSpec Limits { get; init; }
}
