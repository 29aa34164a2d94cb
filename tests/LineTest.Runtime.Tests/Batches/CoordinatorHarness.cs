using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Thermometry;
using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Runtime.Tests.Batches;

/// <summary>
/// The real coordinator over the simulated rig of the committed demo fixture and one of the committed sequences (the
/// CTP-40A DAC sequence unless told), with units of the sequence's product, in virtual time.
/// </summary>
internal sealed class CoordinatorHarness
{
    public const string DacSequence = "sequences/ctp40a-dac.json";
    public const string ResistorSequence = "sequences/ctp40r-resistor.json";
    public const string FirmwareSequence = "sequences/ctp40d-firmware.json";

    public CoordinatorHarness(
        int seed = 11,
        Func<SequenceDefinition, SequenceDefinition>? editSequence = null,
        IRunSink? sink = null,
        string sequenceFile = DacSequence,
        Func<FixtureDefinition, FixtureDefinition>? editFixture = null,
        Func<SimulatedRig, RigInstruments>? instruments = null)
    {
        var fixture = DefinitionFile.Fixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"));
        Assert.True(fixture.IsSuccess, string.Join("\n", fixture.Problems));
        Fixture = editFixture is null ? fixture.Value! : editFixture(fixture.Value!);
        var sequence = DefinitionFile.Sequence(RepoFiles.Path(sequenceFile), Fixture);
        Assert.True(sequence.IsSuccess, string.Join("\n", sequence.Problems));
        // The committed sequences mark their setpoint order free; the harness pins file order so that tests name the
        // setpoint a unit is at without working out the travel plan (a test that wants free order sets it back).
        var pinned = sequence.Value! with { SetpointOrder = SetpointOrders.Fixed };
        Sequence = editSequence is null ? pinned : editSequence(pinned);
        Sha256 = sequence.Sha256!;
        var sensor = ReferenceSensorFactory.Create(Fixture.Reference.Sensor).Sensor!;
        Clock = new VirtualTimeProvider(new DateTimeOffset(2026, 12, 2, 6, 0, 0, TimeSpan.Zero));
        Rig = new SimulatedRig(Fixture, seed, Clock, c => sensor.FromCelsius(c).Value);
        Design = SimulatedUnitDesign.ForProduct(Sequence.Product)!;
        Factory = new SimulatedUnitFactory(seed, Rig.Simulation, Design);
        Sink = sink ?? new ListSink();
        Coordinator = new BatchCoordinator(instruments?.Invoke(Rig) ?? Rig.Instruments, Fixture, raw => sensor.ToCelsius(raw) is { IsSuccess: true } r ? r.Value : double.NaN,
            Clock, Sink, Operator, null, NullLogger.Instance, partFitting: new SimulatedPartFitting(Rig));
    }

    public FixtureDefinition Fixture { get; }

    public SequenceDefinition Sequence { get; }

    public string Sha256 { get; }

    public VirtualTimeProvider Clock { get; }

    public SimulatedRig Rig { get; }

    public SimulatedUnitDesign Design { get; }

    public SimulatedUnitFactory Factory { get; }

    public IRunSink Sink { get; }

    public AutoConfirmOperator Operator { get; } = new();

    public BatchCoordinator Coordinator { get; }

    public List<RunRecord> Stored => ((ListSink)Sink).Runs;

    /// <summary>Loads one unit per defect given (None for a good unit) into slots 1, 2, …</summary>
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

    public BatchRequest Request(IEnumerable<SimulatedUnit> units) => new()
    {
        Sequence = Sequence,
        SequenceSha256 = Sha256,
        Station = "ST-T",
        Loads = units.Select((u, i) => new SlotLoad(i + 1, u.Serial)).ToList(),
        Lot = "L-TEST",
    };

    public Task<BatchOutcome> RunAsync(IEnumerable<SimulatedUnit> units, CancellationToken ct = default) =>
        Coordinator.RunAsync(Request(units), ct);

    internal sealed class ListSink : IRunSink
    {
        public List<RunRecord> Runs { get; } = [];

        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
        {
            Runs.Add(run);
            return Task.CompletedTask;
        }
    }
}
