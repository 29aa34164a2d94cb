using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;

namespace LineTest.Station.Composition;

/// <summary>
/// A station on the built-in simulator: the simulated rig of a fixture, the production line of the sequence's product
/// (<see cref="SimulatedUnitFactory"/>), and coordinators over the rig (<see cref="Coordinator"/>).
/// </summary>
public sealed class SimulatedStation
{
    private SimulatedStation(FixtureDefinition fixture, SimulatedRig rig, SimulatedUnitFactory factory, TimeProvider clock)
    {
        Fixture = fixture;
        Rig = rig;
        Factory = factory;
        Clock = clock;
    }

    /// <summary>The fixture the rig was built from.</summary>
    public FixtureDefinition Fixture { get; }

    /// <summary>The simulated rig (faults are injected and units loaded here).</summary>
    public SimulatedRig Rig { get; }

    /// <summary>The production line of units.</summary>
    public SimulatedUnitFactory Factory { get; }

    /// <summary>The rig's clock.</summary>
    public TimeProvider Clock { get; }

    /// <summary>
    /// Builds the simulated rig of <paramref name="fixture"/> and the production line of <paramref name="product"/>,
    /// both seeded with <paramref name="seed"/> (same seed, same units and readings); the first unit's serial is
    /// <paramref name="yearWeek"/>-<paramref name="firstSerialCounter"/> (YYWW-NNNNNN).
    /// </summary>
    public static SimulatedStation Create(FixtureDefinition fixture, string product, int seed, TimeProvider clock, int firstSerialCounter = 1, int yearWeek = 2612)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(clock);
        var sensor = ReferenceConversion.SensorOf(fixture);
        var rig = new SimulatedRig(fixture, seed, clock, ReferenceConversion.FromCelsius(sensor));
        var design = SimulatedUnitDesign.ForProduct(product)
            ?? throw new InvalidOperationException(
                $"The simulator builds {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}, not '{product}'.");
        return new SimulatedStation(fixture, rig, new SimulatedUnitFactory(seed, rig.Simulation, design, yearWeek, firstSerialCounter), clock);
    }

    /// <summary>
    /// A coordinator over the rig's instruments (or <paramref name="instruments"/>: the rig's behind a wrapper, or its
    /// serial twins), fitting select-on-test parts into the simulated units unless <paramref name="parts"/> says otherwise.
    /// </summary>
    public BatchCoordinator Coordinator(IRunSink sink, CoordinatorParts? parts = null, RigInstruments? instruments = null)
    {
        parts ??= new CoordinatorParts();
        return StationComposition.Coordinator(Fixture, instruments ?? Rig.Instruments, Clock, sink,
            parts.PartFitting is null ? parts with { PartFitting = new SimulatedPartFitting(Rig) } : parts);
    }

    /// <summary>Takes the next unit off the line for each of <paramref name="slots"/>, in order, and loads it there.</summary>
    public IReadOnlyList<(SlotLoad Load, SimulatedUnit Unit)> LoadUnits(IEnumerable<int> slots)
    {
        ArgumentNullException.ThrowIfNull(slots);
        var loaded = new List<(SlotLoad, SimulatedUnit)>();
        foreach (var slot in slots)
        {
            var unit = Factory.NextUnit();
            Rig.Load(slot, unit);
            loaded.Add((new SlotLoad(slot, unit.Serial), unit));
        }

        return loaded;
    }
}
