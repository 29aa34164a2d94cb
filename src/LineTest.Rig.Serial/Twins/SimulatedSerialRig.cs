using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Reference;
using LineTest.Rig.Serial.Rigs;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// A simulated rig whose instruments are reached over serial ports: the <see cref="SimulatedRig"/>'s block, reference,
/// meter and unit links each answer their protocol on a pseudo-terminal, and the real drivers (<see cref="SerialRig"/>)
/// talk to them. Every call on <see cref="Instruments"/> really crosses a serial port. Linux only.
/// </summary>
/// <remarks>
/// The simulated rig keeps its virtual clock; the drivers' timeouts are wall time, which is fine because the twins
/// answer at once and the coordinator waits on one virtual timer at a time, never during an exchange.
/// </remarks>
public sealed class SimulatedSerialRig : IDisposable
{
    private readonly string _portDirectory;
    private readonly bool _ownsDirectory;
    private readonly Dictionary<int, UnitLinkTwin> _units = [];
    private bool _disposed;

    /// <summary>Puts <paramref name="rig"/> behind pseudo-terminals and opens drivers on them.</summary>
    public SimulatedSerialRig(SimulatedRig rig, ILoggerFactory loggers, SimulatedSerialRigOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(rig);
        ArgumentNullException.ThrowIfNull(loggers);
        options ??= new SimulatedSerialRigOptions();
        Simulated = rig;
        _ownsDirectory = options.PortDirectory is null;
        _portDirectory = options.PortDirectory ?? Directory.CreateTempSubdirectory("linetest-ports-").FullName;
        var logger = loggers.CreateLogger<SimulatedSerialRig>();
        var fixture = rig.Fixture;
        try
        {
            Source = new SourceTwin(rig.Block, Port("source"), logger);
            Reference = new ReferenceTwin(rig.Reference, ReferenceCommands.UnitFor(fixture.Reference.Sensor.Kind), Port("reference"), logger);
            Meter = new MeterTwin(rig.Meter, Port("meter"), logger);
            SourceMeter = rig.SourceMeter is { } smu ? new SourceMeterTwin(smu, Port("smu"), logger) : null;
            foreach (var (slot, link) in rig.UnitLinks)
            {
                _units[slot] = new UnitLinkTwin(link, Port($"unit{slot}"), logger);
            }

            PortDefinition Def(string instrument, string name, int? timeoutMs = null) => new()
            {
                Name = name,
                Baud = options.Baud,
                TimeoutMs = options.TimeoutsMs?.GetValueOrDefault(instrument) is > 0 and var own ? own : timeoutMs ?? options.TimeoutMs,
                Retries = options.Retries,
            };
            Fixture = fixture with
            {
                Rig = "serial",
                Source = fixture.Source with { Port = Def("source", Source.Server.PortName) },
                Reference = fixture.Reference with { Port = Def("reference", Reference.Server.PortName) },
                Meter = fixture.Meter with { Port = Def("meter", Meter.Server.PortName) },
                SourceMeter = SourceMeter is null ? null : fixture.SourceMeter! with { Port = Def("source-measure unit", SourceMeter.Server.PortName) },
                Slots = [.. fixture.Slots.Select(s => s with { UnitPort = Def($"unit slot {s.Slot}", _units[s.Slot].Server.PortName, options.UnitTimeoutMs) })],
            };
            Drivers = SerialRig.Open(Fixture, loggers);
        }
        catch
        {
            Dispose();
            throw;
        }
    }

    /// <summary>The simulated rig behind the ports (load units, inject faults here).</summary>
    public SimulatedRig Simulated { get; }

    /// <summary>The fixture as the drivers see it: <c>rig: "serial"</c> with the pseudo-terminal ports.</summary>
    public FixtureDefinition Fixture { get; } = null!;

    /// <summary>The real drivers.</summary>
    public SerialRig Drivers { get; } = null!;

    /// <summary>The instruments as the runtime sees them; every call crosses a serial port.</summary>
    public RigInstruments Instruments => Drivers.Instruments;

    /// <summary>The source twin.</summary>
    public SourceTwin Source { get; } = null!;

    /// <summary>The reference twin.</summary>
    public ReferenceTwin Reference { get; } = null!;

    /// <summary>The meter twin.</summary>
    public MeterTwin Meter { get; } = null!;

    /// <summary>The source-measure unit twin, or null when the fixture has none.</summary>
    public SourceMeterTwin? SourceMeter { get; }

    /// <summary>Each slot's unit-link twin.</summary>
    public IReadOnlyDictionary<int, UnitLinkTwin> Units => _units;

    /// <summary>Closes the drivers' ports first, then the twins' (the other order can hang a serial port).</summary>
    public void Dispose()
    {
        if (_disposed)
        {
            return;
        }

        _disposed = true;
        Drivers?.Dispose();
        Source?.Dispose();
        Reference?.Dispose();
        Meter?.Dispose();
        SourceMeter?.Dispose();
        foreach (var unit in _units.Values)
        {
            unit.Dispose();
        }

        if (_ownsDirectory)
        {
            try
            {
                Directory.Delete(_portDirectory, recursive: true);
            }
            catch (IOException)
            {
                // Best effort: an empty folder left in the temporary folder does no harm.
            }
        }
    }

    private string Port(string name) => Path.Combine(_portDirectory, name);
}
