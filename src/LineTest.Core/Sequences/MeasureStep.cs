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

    /// <summary>
    /// Where the unit's output is read: <c>meter</c> (volts on the slot's output channel, the default) or <c>link</c>
    /// (raw ADC counts over the unit's link, see <see cref="UnitOutputs"/>).
    /// </summary>
    public string Output { get; init; } = UnitOutputs.Meter;

    /// <summary>Optional limits on the unit's output (unit V, mV or uV from the meter; count from the link).</summary>
    public LimitSpec? OutputLimits { get; init; }
}
