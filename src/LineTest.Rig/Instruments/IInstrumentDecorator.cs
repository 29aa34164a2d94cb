namespace LineTest.Rig.Instruments;

/// <summary>
/// Wraps each instrument of a <see cref="RigInstruments"/> set (garbage replies, a watch on the source, …). One method
/// per instrument kind, so adding an instrument to the set adds a method here and every decorator stops compiling until
/// it handles the new instrument; <see cref="RigInstruments.Decorate"/> calls each for every instrument present.
/// </summary>
public interface IInstrumentDecorator
{
    /// <summary>The temperature source to use in place of <paramref name="source"/>.</summary>
    ITemperatureSource Decorate(ITemperatureSource source);

    /// <summary>The reference readout to use in place of <paramref name="reference"/>.</summary>
    IReferenceReadout Decorate(IReferenceReadout reference);

    /// <summary>The voltmeter to use in place of <paramref name="meter"/>.</summary>
    IVoltmeter Decorate(IVoltmeter meter);

    /// <summary>The unit link of <paramref name="slot"/> to use in place of <paramref name="link"/>.</summary>
    IUnitLink Decorate(int slot, IUnitLink link);

    /// <summary>The source-measure unit to use in place of <paramref name="sourceMeter"/>.</summary>
    ISourceMeter Decorate(ISourceMeter sourceMeter);
}
