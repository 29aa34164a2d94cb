namespace LineTest.Rig.Simulation;

/// <summary>
/// An instrument fault to inject into a <see cref="SimulatedRig"/>. Made by the factory methods; command-counted
/// faults let the instrument answer <see cref="AfterCommands"/> more commands normally before they take hold, so a
/// fault can be placed in the middle of a run.
/// </summary>
public sealed record RigFault
{
    private RigFault(RigFaultKind kind, int afterCommands, int? slot, double driftCPerHour)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(afterCommands);
        Kind = kind;
        AfterCommands = afterCommands;
        Slot = slot;
        DriftCPerHour = driftCPerHour;
    }

    /// <summary>What goes wrong.</summary>
    public RigFaultKind Kind { get; }

    /// <summary>Commands the instrument still answers normally before the fault takes hold.</summary>
    public int AfterCommands { get; }

    /// <summary>The slot whose unit link is affected (unit faults only).</summary>
    public int? Slot { get; }

    /// <summary>Drift rate of the reference, °C per hour (reference drift only).</summary>
    public double DriftCPerHour { get; }

    /// <summary>The voltmeter stops answering after <paramref name="afterCommands"/> more reads.</summary>
    public static RigFault MeterSilent(int afterCommands = 0) => new(RigFaultKind.MeterSilent, afterCommands, null, 0);

    /// <summary>The voltmeter replies with garbage after <paramref name="afterCommands"/> more reads.</summary>
    public static RigFault MeterGarbage(int afterCommands = 0) => new(RigFaultKind.MeterGarbage, afterCommands, null, 0);

    /// <summary>The voltmeter's port is lost after <paramref name="afterCommands"/> more reads.</summary>
    public static RigFault MeterPortLost(int afterCommands = 0) => new(RigFaultKind.MeterPortLost, afterCommands, null, 0);

    /// <summary>The source stops answering after <paramref name="afterCommands"/> more commands.</summary>
    public static RigFault SourceSilent(int afterCommands = 0) => new(RigFaultKind.SourceSilent, afterCommands, null, 0);

    /// <summary>The source-measure unit falls silent after <paramref name="afterCommands"/> commands.</summary>
    public static RigFault SourceMeterSilent(int afterCommands = 0) => new(RigFaultKind.SourceMeterSilent, afterCommands, null, 0);

    /// <summary>The source's heater fails now: the block drifts to ambient and refuses setpoints.</summary>
    public static RigFault SourceHeaterFault() => new(RigFaultKind.SourceHeaterFault, 0, null, 0);

    /// <summary>The reference readout stops answering after <paramref name="afterCommands"/> more reads.</summary>
    public static RigFault ReferenceSilent(int afterCommands = 0) => new(RigFaultKind.ReferenceSilent, afterCommands, null, 0);

    /// <summary>From now on the reference reports the well temperature plus <paramref name="driftCPerHour"/> × hours elapsed.</summary>
    public static RigFault ReferenceDrift(double driftCPerHour)
    {
        if (!double.IsFinite(driftCPerHour) || driftCPerHour == 0)
        {
            throw new ArgumentOutOfRangeException(nameof(driftCPerHour), driftCPerHour, "A reference drift must be a finite, non-zero rate in °C per hour.");
        }

        return new(RigFaultKind.ReferenceDrift, 0, null, driftCPerHour);
    }

    /// <summary>The unit in <paramref name="slot"/> stops answering after <paramref name="afterCommands"/> more link commands.</summary>
    public static RigFault UnitSilent(int slot, int afterCommands = 0) => new(RigFaultKind.UnitSilent, afterCommands, slot, 0);

    /// <summary>The unit in <paramref name="slot"/> replies with corrupted frames after <paramref name="afterCommands"/> more link commands.</summary>
    public static RigFault UnitGarbage(int slot, int afterCommands = 0) => new(RigFaultKind.UnitGarbage, afterCommands, slot, 0);
}
