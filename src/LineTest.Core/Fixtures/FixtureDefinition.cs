using System.Text.Json.Serialization;

namespace LineTest.Core.Fixtures;

/// <summary>
/// A fixture: the physical holder and wiring at a station — the temperature source, its slots,
/// which meter channel and unit port each slot uses, the reference thermometer, and the source's safe range.
/// Loaded from one JSON file in <c>fixtures/</c>.
/// </summary>
public sealed record FixtureDefinition
{
    /// <summary>Editor schema reference; ignored by the station.</summary>
    [JsonPropertyName("$schema")]
    public string? Schema { get; init; }

    /// <summary>Stable fixture id, stored with every run.</summary>
    public required string Id { get; init; }

    /// <summary>Human-readable name shown on the operator screen.</summary>
    public string? Name { get; init; }

    /// <summary><c>simulator</c> for the built-in rig, <c>serial</c> for real instruments.</summary>
    public string Rig { get; init; } = "simulator";

    /// <summary>The temperature source (dry block, bath or chamber).</summary>
    public required SourceDefinition Source { get; init; }

    /// <summary>The reference thermometer and its readout.</summary>
    public required ReferenceDefinition Reference { get; init; }

    /// <summary>The DC voltmeter with its channel scanner.</summary>
    public required MeterDefinition Meter { get; init; }

    /// <summary>The source-measure unit for I–V sweeps, or null when the fixture has none.</summary>
    public SourceMeterDefinition? SourceMeter { get; init; }

    /// <summary>The barcode scanner, or null for the keyboard (a keyboard-wedge scanner types each code and Enter).</summary>
    public ScannerDefinition? Scanner { get; init; }

    /// <summary>The slots, each holding one unit.</summary>
    public required IReadOnlyList<SlotDefinition> Slots { get; init; }

    /// <summary>Physical parameters used only by the built-in simulator.</summary>
    public SimulationDefinition? Simulation { get; init; }

    /// <summary>
    /// The well offset the fixture's calibration states for <paramref name="slot"/> (<see cref="SlotDefinition.WellOffsetC"/>),
    /// °C; 0 when it states none or there is no such slot. The temperature of that slot's unit is the reference plus this.
    /// </summary>
    public double WellOffsetC(int slot) => Slots.FirstOrDefault(s => s.Slot == slot)?.WellOffsetC ?? 0.0;
}
