namespace LineTest.Core.Fixtures;

/// <summary>One position of a fixture that holds one unit, and its wiring.</summary>
public sealed record SlotDefinition
{
    /// <summary>Slot number, 1-based, as printed on the fixture.</summary>
    public required int Slot { get; init; }

    /// <summary>Meter channel that reads the unit's analog output.</summary>
    public required int OutputChannel { get; init; }

    /// <summary>Meter channel across the slot's supply shunt.</summary>
    public required int SupplyChannel { get; init; }

    /// <summary>Supply shunt resistance, Ω; supply current = shunt volts / this.</summary>
    public double SupplyShuntOhms { get; init; } = 10;

    /// <summary>Source-measure unit channel wired to the slot's sensor, or null when the slot has none.</summary>
    public int? SmuChannel { get; init; }

    /// <summary>
    /// The slot's well temperature minus the reference well's at a setpoint, °C, as the fixture's own calibration found it
    /// (a reference thermometer in each well in turn, at the calibration setpoints); null when not measured (0). The
    /// station adds it to the reference reading for this slot's calibration points and verify. A source whose well
    /// offsets change with temperature needs them measured at the setpoints used; what is left after the correction is
    /// <see cref="SourceDefinition.WellUniformityC"/>.
    /// </summary>
    public double? WellOffsetC { get; init; }

    /// <summary>The unit's own serial link.</summary>
    public PortDefinition? UnitPort { get; init; }
}
