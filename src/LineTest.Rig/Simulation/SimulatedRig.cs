using LineTest.Core.Fixtures;
using LineTest.Core.Trims;
using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// The built-in simulated rig of one fixture: a dry block, a reference readout in its reference well, a scanning
/// voltmeter wired to every slot's output and supply shunt, and a unit link per slot. Units are loaded and unloaded
/// by the caller (the simulated operator); instrument faults can be injected on demand.
/// </summary>
/// <remarks>
/// Everything is repeatable for a given seed and sequence of calls: each component draws from its own
/// <see cref="Random"/> seeded from <c>seed</c>. The rig never waits on a timer; all dynamics are computed from
/// the <see cref="TimeProvider"/>'s clock, normally a <see cref="VirtualTimeProvider"/>.
/// </remarks>
public sealed class SimulatedRig
{
    /// <summary>Room temperature, °C: where a freshly loaded unit's sensor starts, and where a block without heating drifts.</summary>
    public const double DefaultAmbientC = 23.0;

    private readonly IReadOnlyDictionary<int, SimulatedSlot> _slots;
    private readonly Dictionary<int, SimulatedUnitLink> _links;

    // Concurrency: guarded by _partsLock (the simulated operator may fit parts from any thread).
    private readonly Random _parts;
    private readonly Lock _partsLock = new();

    /// <summary>Builds the rig of <paramref name="fixture"/>.</summary>
    /// <param name="fixture">The fixture; its <see cref="FixtureDefinition.Simulation"/> (or the defaults) gives the physics.</param>
    /// <param name="seed">Seed for every noise source of the rig.</param>
    /// <param name="timeProvider">The clock, normally a <see cref="VirtualTimeProvider"/>.</param>
    /// <param name="celsiusToRaw">The reference sensor's raw quantity as a function of °C (e.g. its Callendar–Van Dusen resistance).</param>
    public SimulatedRig(FixtureDefinition fixture, int seed, TimeProvider timeProvider, Func<double, double> celsiusToRaw)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(timeProvider);
        ArgumentNullException.ThrowIfNull(celsiusToRaw);
        ValidateWiring(fixture);

        Fixture = fixture;
        Simulation = fixture.Simulation ?? new SimulationDefinition();
        TimeProvider = timeProvider;
        var seeds = new Random(seed);
        Block = new SimulatedDryBlock(fixture.Source, Simulation, timeProvider, seeds.Next());
        Reference = new SimulatedReferenceReadout(Block, celsiusToRaw, fixture.Reference.ReadoutResolution, timeProvider, seeds.Next(),
            lagSeconds: Simulation.ReferenceLagTimeConstantSeconds);
        _slots = fixture.Slots.ToDictionary(s => s.Slot, s => new SimulatedSlot(s, Block, timeProvider));
        Meter = new SimulatedVoltmeter(fixture.Meter, _slots.Values, seeds.Next());
        _links = _slots.ToDictionary(p => p.Key, p => new SimulatedUnitLink(p.Value));
        _parts = new Random(seeds.Next());

        // Drawn after the parts seed so the rig's other noise streams stay what they were before the SMU existed.
        var smuSeed = seeds.Next();
        SourceMeter = fixture.SourceMeter is { } smu ? new SimulatedSourceMeter(smu, _slots.Values, smuSeed) : null;
        Instruments = new RigInstruments(Block, Reference, Meter, _links.ToDictionary(p => p.Key, p => (IUnitLink)p.Value), SourceMeter);
    }

    /// <summary>The fixture the rig was built from.</summary>
    public FixtureDefinition Fixture { get; }

    /// <summary>The simulation parameters in use (the fixture's, or the defaults).</summary>
    public SimulationDefinition Simulation { get; }

    /// <summary>The rig's clock.</summary>
    public TimeProvider TimeProvider { get; }

    /// <summary>The dry block (also the rig's temperature source).</summary>
    public SimulatedDryBlock Block { get; }

    /// <summary>The reference readout.</summary>
    public SimulatedReferenceReadout Reference { get; }

    /// <summary>The voltmeter.</summary>
    public SimulatedVoltmeter Meter { get; }

    /// <summary>Each slot's unit link, keyed by slot number.</summary>
    public IReadOnlyDictionary<int, SimulatedUnitLink> UnitLinks => _links;

    /// <summary>The source-measure unit, or null when the fixture has none.</summary>
    public SimulatedSourceMeter? SourceMeter { get; }

    /// <summary>The instruments as the runtime sees them.</summary>
    public RigInstruments Instruments { get; }

    /// <summary>Puts <paramref name="unit"/> into <paramref name="slot"/>; its sensor starts at <see cref="DefaultAmbientC"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The fixture has no such slot.</exception>
    /// <exception cref="InvalidOperationException">The slot is occupied, or the unit is already in another slot.</exception>
    public void Load(int slot, SimulatedUnit unit)
    {
        ArgumentNullException.ThrowIfNull(unit);
        var target = SlotOf(slot);
        foreach (var other in _slots.Values)
        {
            if (ReferenceEquals(other.Unit, unit))
            {
                throw new InvalidOperationException($"Unit {unit.Serial} is already in slot {other.Definition.Slot}.");
            }
        }

        target.Load(unit, DefaultAmbientC);
    }

    /// <summary>Takes the unit out of <paramref name="slot"/> and returns it (null if the slot was empty).</summary>
    public SimulatedUnit? Unload(int slot) => SlotOf(slot).Unload();

    /// <summary>The unit in <paramref name="slot"/>, or null.</summary>
    public SimulatedUnit? UnitIn(int slot) => SlotOf(slot).Unit;

    /// <summary>
    /// The simulated operator fits select-on-test parts into the resistor-trimmed unit in <paramref name="slot"/>:
    /// each part's actual value is drawn around its nominal within the design's part tolerance (normal, σ = half the
    /// tolerance, cut at ±tolerance), pairs are combined as connected. Returns the actual ohms now at each position.
    /// </summary>
    /// <exception cref="InvalidOperationException">The slot is empty, or its unit has no such position.</exception>
    public IReadOnlyDictionary<string, double> FitParts(int slot, IEnumerable<ResistorChoice> choices)
    {
        ArgumentNullException.ThrowIfNull(choices);
        var target = SlotOf(slot);
        var fitted = new Dictionary<string, double>(StringComparer.Ordinal);
        lock (target.Gate)
        {
            var unit = target.CurrentUnitLocked() ?? throw new InvalidOperationException($"Slot {slot} is empty: there is no unit to fit parts into.");
            if (unit.Design.Kind != SimulatedUnitKind.ResistorTrimmed)
            {
                throw new InvalidOperationException($"Unit {unit.Serial} is a {unit.Design.Product}: it has no select-on-test positions.");
            }

            var tolerance = unit.Design.TrimPartTolerancePercent / 100.0;
            foreach (var choice in choices)
            {
                double[] actual;
                lock (_partsLock)
                {
                    actual = choice.Parts.Select(p => p * _parts.NextTruncatedNormal(1, tolerance / 2, 1 - tolerance, 1 + tolerance)).ToArray();
                }

                var ohms = ResistorChoice.Combine(choice.Connection, actual);
                unit.Fit(choice.Position, ohms);
                fitted[choice.Position] = ohms;
            }
        }

        return fitted;
    }

    /// <summary>
    /// Injects a fault. Command-counted faults hold from the (<see cref="RigFault.AfterCommands"/> + 1)-th command to
    /// the affected instrument on; a heater fault and a reference drift start now. Faults stay until
    /// <see cref="ClearFaults"/>.
    /// </summary>
    public void InjectFault(RigFault fault)
    {
        ArgumentNullException.ThrowIfNull(fault);
        switch (fault.Kind)
        {
            case RigFaultKind.MeterSilent or RigFaultKind.MeterGarbage or RigFaultKind.MeterPortLost:
                Meter.ArmFault(fault);
                break;
            case RigFaultKind.SourceMeterSilent:
                (SourceMeter ?? throw new InvalidOperationException($"Fixture '{Fixture.Id}' has no source-measure unit to fault.")).ArmFault(fault);
                break;
            case RigFaultKind.SourceSilent or RigFaultKind.SourceHeaterFault:
                Block.ArmFault(fault);
                break;
            case RigFaultKind.ReferenceSilent or RigFaultKind.ReferenceDrift:
                Reference.ArmFault(fault);
                break;
            case RigFaultKind.UnitSilent or RigFaultKind.UnitGarbage:
                var slot = SlotOf(fault.Slot ?? throw new ArgumentException("A unit fault needs a slot.", nameof(fault)));
                lock (slot.Gate)
                {
                    slot.LinkFaults.Arm(fault);
                }

                break;
            default:
                throw new ArgumentOutOfRangeException(nameof(fault), fault.Kind, "Unknown fault kind.");
        }
    }

    /// <summary>Removes every injected fault (a heater fault is repaired; the block holds its present course until the next setpoint).</summary>
    public void ClearFaults()
    {
        Meter.ClearFaults();
        SourceMeter?.ClearFaults();
        Block.ClearFaults();
        Reference.ClearFaults();
        foreach (var slot in _slots.Values)
        {
            lock (slot.Gate)
            {
                slot.LinkFaults.Clear();
            }
        }
    }

    private static void ValidateWiring(FixtureDefinition fixture)
    {
        ArgumentNullException.ThrowIfNull(fixture.Source);
        ArgumentNullException.ThrowIfNull(fixture.Reference);
        ArgumentNullException.ThrowIfNull(fixture.Meter);
        ArgumentNullException.ThrowIfNull(fixture.Slots);
        var slotNumbers = new HashSet<int>();
        var channels = new Dictionary<int, string>();
        foreach (var slot in fixture.Slots)
        {
            if (slot.Slot < 1 || !slotNumbers.Add(slot.Slot))
            {
                throw new ArgumentException($"Fixture '{fixture.Id}': slot number {slot.Slot} is not positive or appears twice.", nameof(fixture));
            }

            if (!(slot.SupplyShuntOhms > 0))
            {
                throw new ArgumentException($"Fixture '{fixture.Id}': slot {slot.Slot} needs a positive supplyShuntOhms.", nameof(fixture));
            }

            foreach (var (channel, role) in new[] { (slot.OutputChannel, "output"), (slot.SupplyChannel, "supply") })
            {
                if (channel < 1)
                {
                    throw new ArgumentException($"Fixture '{fixture.Id}': slot {slot.Slot} {role} channel {channel} is not a meter channel (channels start at 1).", nameof(fixture));
                }

                if (!channels.TryAdd(channel, $"slot {slot.Slot} {role}"))
                {
                    throw new ArgumentException($"Fixture '{fixture.Id}': meter channel {channel} is wired twice ({channels[channel]} and slot {slot.Slot} {role}).", nameof(fixture));
                }
            }
        }
    }

    private SimulatedSlot SlotOf(int slot)
        => _slots.TryGetValue(slot, out var found)
            ? found
            : throw new ArgumentOutOfRangeException(nameof(slot), slot, $"Fixture '{Fixture.Id}' has no slot {slot}.");
}
