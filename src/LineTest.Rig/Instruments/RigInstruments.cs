namespace LineTest.Rig.Instruments;

/// <summary>The instruments of one fixture, as the runtime sees them.</summary>
/// <param name="Source">Temperature source.</param>
/// <param name="Reference">Reference thermometer readout.</param>
/// <param name="Meter">DC voltmeter with channel scanner.</param>
/// <param name="UnitLinks">Each slot's unit link, keyed by slot number.</param>
/// <param name="SourceMeter">The source-measure unit for I–V sweeps, or null when the fixture has none.</param>
/// <remarks>
/// Adding an instrument: a parameter here, a method on <see cref="IInstrumentDecorator"/> and a line in
/// <see cref="Decorate"/>; a reflection test checks that every wrapper of the set passes every instrument on.
/// </remarks>
public sealed record RigInstruments(
    ITemperatureSource Source,
    IReferenceReadout Reference,
    IVoltmeter Meter,
    IReadOnlyDictionary<int, IUnitLink> UnitLinks,
    ISourceMeter? SourceMeter = null)
{
    /// <summary>The same set with every instrument present wrapped by <paramref name="decorator"/> (absent ones stay absent).</summary>
    public RigInstruments Decorate(IInstrumentDecorator decorator)
    {
        ArgumentNullException.ThrowIfNull(decorator);
        return new RigInstruments(
            decorator.Decorate(Source),
            decorator.Decorate(Reference),
            decorator.Decorate(Meter),
            UnitLinks.ToDictionary(p => p.Key, p => decorator.Decorate(p.Key, p.Value)),
            SourceMeter is null ? null : decorator.Decorate(SourceMeter));
    }
}
