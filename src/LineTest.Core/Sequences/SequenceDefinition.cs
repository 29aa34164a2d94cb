using System.Text.Json.Serialization;

namespace LineTest.Core.Sequences;

/// <summary>
/// A sequence: the JSON test definition for one product revision, kept in <c>sequences/</c>.
/// Property names are the JSON keys (camelCase) and are a contract with test engineers' files.
/// </summary>
public sealed record SequenceDefinition
{
    /// <summary>Editor schema reference; ignored by the station.</summary>
    [JsonPropertyName("$schema")]
    public string? Schema { get; init; }

    /// <summary>Stable sequence id, e.g. <c>ctp40a-cal</c>.</summary>
    public required string Id { get; init; }

    /// <summary>Revision number; raise it with every change released to production.</summary>
    public required int Revision { get; init; }

    /// <summary>Product name, e.g. <c>CTP-40A</c>.</summary>
    public required string Product { get; init; }

    /// <summary>What the sequence does, for people.</summary>
    public string? Description { get; init; }

    /// <summary>Regular expression every scanned serial must match (whole serial).</summary>
    public required string SerialPattern { get; init; }

    /// <summary>
    /// A serial that matches <see cref="SerialPattern"/>, shown to the operator when a scan is refused
    /// ("expected like CTP40A-2612-000123") instead of the pattern itself.
    /// </summary>
    public string? SerialExample { get; init; }

    /// <summary>Where units go after their run (shown on the end screen and stored with each run).</summary>
    public DispositionSettings? Dispositions { get; init; }

    /// <summary>When the source counts as stable at a setpoint.</summary>
    public required StabilitySettings Stability { get; init; }

    /// <summary>How long units soak once the source is stable.</summary>
    public required SoakSettings Soak { get; init; }

    /// <summary>How the station decides the source and units have settled (window mode when absent).</summary>
    public SettleSettings? Settle { get; init; }

    /// <summary>The reference temperatures the sequence asks for.</summary>
    public required IReadOnlyList<SetpointDefinition> Setpoints { get; init; }

    /// <summary>The trim method and its parameters, if the product is trimmed.</summary>
    public TrimDefinition? Trim { get; init; }

    /// <summary>
    /// The product's rated temperature range, over which each trimmed unit's error is predicted (and judged where limits
    /// are given); null when the sequence states none.
    /// </summary>
    public RatedRangeDefinition? RatedRange { get; init; }

    /// <summary>
    /// The sensor's nominal bias current in the product, amperes: where I–V sweeps report the forward voltage and its
    /// temperature coefficient (a step's own <c>nominalBiasAmps</c> overrides it).
    /// </summary>
    public double? NominalBiasAmps { get; init; }

    /// <summary>Stop a unit at its first failing reading (it keeps its slot until unload). Default true.</summary>
    public bool StopOnFail { get; init; } = true;

    /// <summary>
    /// <c>fixed</c> (default): setpoints are visited in step order. <c>free</c>: independent settle blocks may be
    /// reordered to shorten the source's travel (<see cref="SetpointOrders.Free"/>).
    /// </summary>
    public string SetpointOrder { get; init; } = SetpointOrders.Fixed;

    /// <summary>The steps, in order.</summary>
    public required IReadOnlyList<StepDefinition> Steps { get; init; }
}
