namespace LineTest.Rig.Instruments;

/// <summary>The instruments of one fixture, as the runtime sees them.</summary>
/// <param name="Source">Temperature source.</param>
/// <param name="Reference">Reference thermometer readout.</param>
/// <param name="Meter">DC voltmeter with channel scanner.</param>
/// <param name="UnitLinks">Each slot's unit link, keyed by slot number.</param>
/// <param name="SourceMeter">The source-measure unit for I–V sweeps, or null when the fixture has none.</param>
public sealed record RigInstruments(
    ITemperatureSource Source,
    IReferenceReadout Reference,
    IVoltmeter Meter,
    IReadOnlyDictionary<int, IUnitLink> UnitLinks,
    ISourceMeter? SourceMeter = null);
