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

    /// <summary>
    /// Where the indicated temperature comes from: <c>meter</c> (the output volts through the trim's target transfer
    /// function, the default) or <c>link</c> (the temperature the unit reports over its link, see <see cref="UnitOutputs"/>).
    /// </summary>
    public string Output { get; init; } = UnitOutputs.Meter;

    /// <summary>Limits on the indicated error (unit degC or K).</summary>
    public required LimitSpec Limits { get; init; }
}
