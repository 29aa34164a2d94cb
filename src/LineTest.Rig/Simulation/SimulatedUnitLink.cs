using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// The simulated serial link to whatever unit is loaded in one slot. An empty slot, a silent unit or an injected
/// silence ends in <c>NoAnswer</c>; a register name the unit does not have or a code outside the DAC's range ends in
/// <c>InstrumentError</c> and changes nothing.
/// </summary>
/// <remarks>
/// The analog CTP-40A has no ADC of its own yet: <see cref="ReadRawAsync"/> returns its output in microvolts as counts
/// and <see cref="ReadTemperatureAsync"/> the temperature its design's target transfer function indicates for that
/// output.
/// </remarks>
public sealed class SimulatedUnitLink : IUnitLink
{
    private readonly SimulatedSlot _slot;
    private readonly string _instrumentName;

    internal SimulatedUnitLink(SimulatedSlot slot)
    {
        _slot = slot;
        _instrumentName = $"unit slot {slot.Definition.Slot}";
    }

    /// <summary>The slot this link is wired to.</summary>
    public int Slot => _slot.Definition.Slot;

    /// <inheritdoc/>
    public Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(() => Command(unit => new UnitIdentity(unit.Serial, unit.Design.Product, unit.Design.Firmware)), cancellationToken);

    /// <inheritdoc/>
    public Task<long> ReadRawAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(() => Command(unit => (long)Math.Round(unit.SampleOutputVolts() * 1e6)), cancellationToken);

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(() => Command(unit => unit.Design.Target.IndicatedC(unit.SampleOutputVolts())), cancellationToken);

    /// <inheritdoc/>
    public Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(values);
        return SimulatedCall.Run(
            () => Command(unit =>
            {
                foreach (var (name, code) in values)
                {
                    if (name != unit.Design.GainRegister && name != unit.Design.OffsetRegister)
                    {
                        throw new InstrumentFaultException(_instrumentName, InstrumentFaultKind.InstrumentError, $"unit rejected unknown register '{name}' (it has {unit.Design.GainRegister} and {unit.Design.OffsetRegister})");
                    }

                    if (code < unit.Design.CodeMin || code > unit.Design.CodeMax)
                    {
                        throw new InstrumentFaultException(_instrumentName, InstrumentFaultKind.InstrumentError, $"unit rejected {name} = {code}: codes run from {unit.Design.CodeMin} to {unit.Design.CodeMax}");
                    }
                }

                unit.WriteWorking(values);
                return true;
            }),
            cancellationToken);
    }

    /// <inheritdoc/>
    public Task StoreAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(
            () => Command(unit =>
            {
                unit.Store();
                return true;
            }),
            cancellationToken);

    /// <inheritdoc/>
    public Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(() => Command(unit => unit.StoredRegisters), cancellationToken);

    private T Command<T>(Func<SimulatedUnit, T> action)
    {
        lock (_slot.Gate)
        {
            if (_slot.LinkFaults.OnCommand() is { } fault)
            {
                throw SimulatedCall.FaultFor(fault, _instrumentName);
            }

            var unit = _slot.CurrentUnitLocked();
            if (unit is null)
            {
                throw new InstrumentFaultException(_instrumentName, InstrumentFaultKind.NoAnswer, "no answer: the slot is empty");
            }

            if (unit.Defect == UnitDefect.Silent)
            {
                throw new InstrumentFaultException(_instrumentName, InstrumentFaultKind.NoAnswer, $"no answer from the unit in slot {Slot}");
            }

            return action(unit);
        }
    }
}
