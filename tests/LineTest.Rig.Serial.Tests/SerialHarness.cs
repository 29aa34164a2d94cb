using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Thermometry;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests;

/// <summary>
/// The committed demo fixture's simulated rig behind pseudo-terminal ports, with the real drivers and, on demand,
/// the real coordinator driving them in virtual time.
/// </summary>
internal sealed class SerialHarness : IDisposable
{
    /// <remarks>
    /// Timeouts default to 2 s: twins answer within milliseconds, but this machine may be shared and heavily loaded.
    /// A test that makes an instrument silent shortens that instrument's timeout only (<paramref name="timeouts"/>).
    /// </remarks>
    public SerialHarness(int seed = 11, int timeoutMs = 2000, int retries = 1, int? unitTimeoutMs = null, Dictionary<string, int>? timeouts = null)
    {
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"));
        Assert.True(fixture.IsSuccess, string.Join("\n", fixture.Problems));
        Fixture = fixture.Value!;
        var sensor = ReferenceSensorFactory.Create(Fixture.Reference.Sensor).Sensor!;
        Sensor = sensor;
        Clock = new VirtualTimeProvider(new DateTimeOffset(2026, 12, 2, 6, 0, 0, TimeSpan.Zero));
        Rig = new SimulatedRig(Fixture, seed, Clock, c => sensor.FromCelsius(c).Value);
        Factory = new SimulatedUnitFactory(seed, Rig.Simulation, SimulatedUnitDesign.Ctp40A);
        Serial = new SimulatedSerialRig(Rig, Loggers, new SimulatedSerialRigOptions { TimeoutMs = timeoutMs, Retries = retries, UnitTimeoutMs = unitTimeoutMs, TimeoutsMs = timeouts });
    }

    public FixtureDefinition Fixture { get; }

    /// <summary>Warnings and errors of the drivers and twins (retries, lost ports, twin failures).</summary>
    public CapturingLoggers Loggers { get; } = new();

    public string Log => string.Join("\n", Loggers.Lines);

    public IReferenceSensor Sensor { get; }

    public VirtualTimeProvider Clock { get; }

    public SimulatedRig Rig { get; }

    public SimulatedUnitFactory Factory { get; }

    public SimulatedSerialRig Serial { get; }

    public List<RunRecord> Stored { get; } = [];

    public List<SimulatedUnit> Load(params UnitDefect[] defects)
    {
        var units = new List<SimulatedUnit>();
        for (var i = 0; i < defects.Length; i++)
        {
            var unit = Factory.NextUnit(defects[i]);
            Rig.Load(i + 1, unit);
            units.Add(unit);
        }

        return units;
    }

    /// <summary>Runs one batch through the serial drivers (or, with <paramref name="inMemory"/>, straight on the simulator).</summary>
    public Task<BatchOutcome> RunBatchAsync(IEnumerable<SimulatedUnit> units, bool inMemory = false, CancellationToken ct = default)
    {
        var sequence = DefinitionFile.Sequence(RepoFiles.Path("sequences/ctp40a-dac.json"), Fixture);
        Assert.True(sequence.IsSuccess, string.Join("\n", sequence.Problems));
        var coordinator = new BatchCoordinator(inMemory ? Rig.Instruments : Serial.Instruments, Fixture, raw => Sensor.ToCelsius(raw) is { IsSuccess: true } r ? r.Value : double.NaN,
            Clock, new ListSink(Stored), new AutoConfirmOperator(), null, NullLogger.Instance);
        var request = new BatchRequest
        {
            Sequence = sequence.Value!,
            SequenceSha256 = sequence.Sha256!,
            Station = "ST-T",
            Loads = units.Select((u, i) => new SlotLoad(i + 1, u.Serial)).ToList(),
            Lot = "L-TEST",
        };
        return coordinator.RunAsync(request, ct);
    }

    public void Dispose() => Serial.Dispose();

    private sealed class ListSink(List<RunRecord> runs) : IRunSink
    {
        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
        {
            runs.Add(run);
            return Task.CompletedTask;
        }
    }
}
