using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>
/// Wraps a fixture's instruments so that, at a given rate, any reply is replaced by garbage drawn from random bytes
/// (see <see cref="GarbageGenerator"/>). Used to show that no reply, however wrong, makes the coordinator crash:
/// every unit still ends pass, fail or error. Every instrument of the set is wrapped (<see cref="IInstrumentDecorator"/>).
/// </summary>
public sealed class GarbageInstruments : IInstrumentDecorator
{
    private readonly GarbageGenerator _garbage;

    /// <summary>Wraps <paramref name="inner"/>.</summary>
    /// <param name="inner">The real (or simulated) instruments.</param>
    /// <param name="seed">Seed of the garbage (same seed and calls, same garbage).</param>
    /// <param name="rate">Fraction of replies replaced, 0 … 1.</param>
    public GarbageInstruments(RigInstruments inner, int seed, double rate)
    {
        ArgumentNullException.ThrowIfNull(inner);
        ArgumentOutOfRangeException.ThrowIfNegative(rate);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(rate, 1);
        _garbage = new GarbageGenerator(seed, rate);
        Instruments = inner.Decorate(this);
    }

    /// <summary>The wrapped instruments.</summary>
    public RigInstruments Instruments { get; }

    /// <summary>How many replies have been replaced so far.</summary>
    public int GarbageReplies => _garbage.Count;

    /// <inheritdoc />
    public ITemperatureSource Decorate(ITemperatureSource source) => new GarbageSource(source, _garbage);

    /// <inheritdoc />
    public IReferenceReadout Decorate(IReferenceReadout reference) => new GarbageReference(reference, _garbage);

    /// <inheritdoc />
    public IVoltmeter Decorate(IVoltmeter meter) => new GarbageVoltmeter(meter, _garbage);

    /// <inheritdoc />
    public IUnitLink Decorate(int slot, IUnitLink link) => new GarbageUnitLink(link, _garbage, $"unit slot {slot}");

    /// <inheritdoc />
    public ISourceMeter Decorate(ISourceMeter sourceMeter) => new GarbageSourceMeter(sourceMeter, _garbage);
}
