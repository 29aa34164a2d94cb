using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Rigs;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// The instruments the hosted station drives: the built-in simulator (whose units appear when their serial is
/// scanned) or real instruments over serial ports (the units are physically there).
/// </summary>
public sealed class StationRig : IDisposable
{
    private readonly SimulatedRig? _simulated;
    private readonly SimulatedUnitFactory? _factory;
    private readonly SerialRig? _serial;

    private StationRig(RigInstruments instruments, TimeProvider clock, IPartFitting? partFitting, SimulatedRig? simulated, SimulatedUnitFactory? factory, SerialRig? serial)
    {
        Instruments = instruments;
        Clock = clock;
        PartFitting = partFitting;
        _simulated = simulated;
        _factory = factory;
        _serial = serial;
    }

    /// <summary>The instruments.</summary>
    public RigInstruments Instruments { get; }

    /// <summary>The clock waits run on (accelerated for the simulator, the wall clock for real instruments).</summary>
    public TimeProvider Clock { get; }

    /// <summary>True for the built-in simulator (its clock runs faster than the wall clock).</summary>
    public bool IsSimulated => _simulated is not null;

    /// <summary>Tells the simulator which resistors were fitted; null for real units.</summary>
    public IPartFitting? PartFitting { get; }

    /// <summary>Builds the rig a fixture names; a problem is returned as text, not thrown.</summary>
    public static (StationRig? Rig, string? Problem) Open(
        FixtureDefinition fixture, SequenceDefinition sequence, StationOptions options, Func<double, double> celsiusToRaw, ILoggerFactory loggers)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(options);
        if (fixture.Rig == "serial")
        {
            var problems = SerialRig.Problems(fixture);
            if (problems.Count > 0)
            {
                return (null, $"fixture '{fixture.Id}' cannot be opened: {string.Join("; ", problems)}");
            }

            var serial = SerialRig.Open(fixture, loggers);
            return (new StationRig(serial.Instruments, TimeProvider.System, null, null, null, serial), null);
        }

        var design = SimulatedUnitDesign.ForProduct(sequence.Product);
        if (design is null)
        {
            return (null, $"sequence '{sequence.Id}' tests '{sequence.Product}', but the simulator builds only {string.Join(", ", SimulatedUnitDesign.Demo.Select(d => d.Product))}");
        }

        var clock = new ScaledTimeProvider(options.SimulatorSpeed);
        var rig = new SimulatedRig(fixture, options.SimulatorSeed, clock, celsiusToRaw);
        var factory = new SimulatedUnitFactory(options.SimulatorSeed, rig.Simulation, design);
        return (new StationRig(rig.Instruments, clock, new SimulatedPartFitting(rig), rig, factory, null), null);
    }

    /// <summary>The operator put the unit with <paramref name="serial"/> in <paramref name="slot"/>.</summary>
    public void Loaded(int slot, string serial)
    {
        if (_simulated is not null && _factory is not null)
        {
            _simulated.Load(slot, _factory.NextUnit(serial));
        }
    }

    /// <summary>The operator took the unit out of <paramref name="slot"/>.</summary>
    public void Unloaded(int slot) => _simulated?.Unload(slot);

    /// <inheritdoc />
    public void Dispose() => _serial?.Dispose();
}
