using LineTest.Core.Decisions;
using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// Reads the reference and each unit's output at the current setpoint and keeps the pair as a calibration point.
/// Optional limits on the raw output catch gross faults (open sensor) before a trim is attempted.
/// </summary>
public sealed record MeasureStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "measure";

    /// <summary>The setpoint the source must be settled at.</summary>
    public required string Setpoint { get; init; }

    /// <summary>Readings averaged (reference and unit interleaved).</summary>
    public int Samples { get; init; } = 10;

    /// <summary>Optional limits on the unit's output (unit V or mV).</summary>
    public LimitSpec? OutputLimits { get; init; }
}
