using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// The simulated serial link to whatever unit is loaded in one slot. An empty slot, a silent unit or an injected
/// silence ends in <c>NoAnswer</c>; a register name the unit does not have or a code outside the DAC's range ends in
/// <c>InstrumentError</c> and changes nothing.
/// </summary>
/// <remarks>
/// <para>The digital CTP-40D answers <see cref="ReadRawAsync"/> with its ADC counts and <see cref="ReadTemperatureAsync"/>
/// with the temperature its firmware computes from its working coefficient registers; it accepts its coefficient
/// registers within their two's-complement width.</para>
/// <para>The analog units have no ADC of their own: <see cref="ReadRawAsync"/> returns the output in microvolts as
/// counts and <see cref="ReadTemperatureAsync"/> the temperature the design's target transfer function indicates for
/// that output. A CTP-40R's link only identifies the unit: it has no trim registers, its trim is the parts the operator
/// fits (<see cref="SimulatedRig.FitParts"/>).</para>
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
        => SimulatedCall.Run(() => Command(unit => unit.SampleRawCounts()), cancellationToken);

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => SimulatedCall.Run(
            () => Command(unit => unit.Design.Kind == SimulatedUnitKind.FirmwareTrimmed
                ? unit.SampleReportedC()
                : unit.Design.Target.IndicatedC(unit.SampleOutputVolts())),
            cancellationToken);

    /// <inheritdoc/>
    public Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(values);
        return SimulatedCall.Run(
            () => Command(unit =>
            {
                foreach (var (name, value) in values)
                {
                    CheckRegister(unit, name, value);
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

    private void CheckRegister(SimulatedUnit unit, string name, long value)
    {
        var design = unit.Design;
        switch (design.Kind)
        {
            case SimulatedUnitKind.ResistorTrimmed:
                throw Rejected($"unit rejected register '{name}': a {design.Product} has no trim registers (its trim is the parts fitted at {design.GainPosition} and {design.OffsetPosition})");
            case SimulatedUnitKind.FirmwareTrimmed:
                var register = design.CoefficientRegisters.FirstOrDefault(r => r.Register == name)
                    ?? throw Rejected($"unit rejected unknown register '{name}' (it has {string.Join(", ", design.CoefficientRegisters.Select(r => r.Register))})");
                if (value < register.MinValue || value > register.MaxValue)
                {
                    throw Rejected($"unit rejected {name} = {value}: a {register.Bits}-bit register holds {register.MinValue} to {register.MaxValue}");
                }

                break;
            default:
                if (name != design.GainRegister && name != design.OffsetRegister)
                {
                    throw Rejected($"unit rejected unknown register '{name}' (it has {design.GainRegister} and {design.OffsetRegister})");
                }

                if (value < design.CodeMin || value > design.CodeMax)
                {
                    throw Rejected($"unit rejected {name} = {value}: codes run from {design.CodeMin} to {design.CodeMax}");
                }

                break;
        }
    }

    private InstrumentFaultException Rejected(string message) => new(_instrumentName, InstrumentFaultKind.InstrumentError, message);

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
