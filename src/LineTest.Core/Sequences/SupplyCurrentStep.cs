using LineTest.Core.Decisions;
using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>Electrical check: the unit's supply current, read across the slot's shunt, within limits.</summary>
public sealed record SupplyCurrentStep : StepDefinition
{
    /// <inheritdoc />
    [JsonIgnore]
    public override string Kind => "supply-current";

    /// <summary>Limits (unit A, mA or uA).</summary>
    public required LimitSpec Limits { get; init; }

    /// <summary>Readings averaged.</summary>
    public int Samples { get; init; } = 3;
}
