using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Simulation;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Demo;

/// <summary>
/// Measures, on the simulator, how close each trimmed unit really is to the truth over the sequence's rated range:
/// every passing unit's true error is read from its simulated part (ground truth) at 1 °C steps over the range, and
/// set against the floor the station's own error budget gives (<c>&lt;trim&gt;.predicted.floorRms</c>).
/// </summary>
/// <remarks>
/// The schedule is a parameter so that other settle and soak strategies can be compared on the same units: the same
/// seed gives the same parts whatever the schedule or fit.
/// </remarks>
public static class AccuracyBench
{
    /// <summary>The fit a firmware trim without its sensor model stands for: a straight line through the points.</summary>
    public const string StraightLine = "straight-line";

    /// <summary>
    /// The variants benchmarked for <paramref name="sequence"/>: both fit objectives for a DAC or resistor trim; for a
    /// firmware trim the sequence as written (curvature model, <c>through-points</c>) and, for comparison, a straight
    /// line through the points without the model.
    /// </summary>
    public static IReadOnlyList<(string Fit, SequenceDefinition Sequence)> Variants(SequenceDefinition sequence)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        if (sequence.Trim is not { } trim)
        {
            return [(TrimFits.ThroughPoints, sequence)];
        }

        if (trim.Method == TrimMethods.Firmware)
        {
            var straight = trim.Firmware is { } fw
                ? trim with { SensorModel = null, Firmware = fw with { Order = 1, Coefficients = fw.Coefficients.Take(2).ToArray() } }
                : trim with { SensorModel = null };
            return [(TrimFits.ThroughPoints, sequence), (StraightLine, sequence with { Trim = straight })];
        }

        return TrimFits.All
            .Where(f => f == TrimFits.ThroughPoints || (trim.SensorModel is not null && sequence.RatedRange is not null))
            .Select(f => (f, sequence with { Trim = trim with { Fit = f } }))
            .ToList();
    }

    /// <summary>Runs <paramref name="batches"/> full batches of defect-free units and measures their true accuracy.</summary>
    /// <param name="fixture">A simulator fixture.</param>
    /// <param name="sequence">The sequence variant (with its rated range).</param>
    /// <param name="fit">The label of the variant's fit.</param>
    /// <param name="batches">Full batches to run.</param>
    /// <param name="seed">Simulator seed (the same parts for every variant).</param>
    /// <param name="schedule">The batch schedule; null for <see cref="BatchSchedule.Fast"/>.</param>
    /// <param name="ct">Cancellation.</param>
    public static async Task<AccuracyFigures> MeasureAsync(
        FixtureDefinition fixture, SequenceDefinition sequence, string fit, int batches, int seed, BatchSchedule? schedule, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(batches);
        var range = sequence.RatedRange
            ?? throw new ArgumentException($"Sequence '{sequence.Id}' states no ratedRange: there is no range to measure the accuracy over.", nameof(sequence));
        var design = SimulatedUnitDesign.ForProduct(sequence.Product)
            ?? throw new ArgumentException($"The simulator builds no '{sequence.Product}' units.", nameof(sequence));
        var verifyC = sequence.Steps.OfType<VerifyStep>().Select(v => sequence.Setpoints.First(s => s.Name == v.Setpoint).Celsius).Cast<double?>().FirstOrDefault();
        var grid = Enumerable.Range(0, (int)Math.Floor(range.HighC - range.LowC) + 1).Select(i => range.LowC + i).ToArray();
        var target = sequence.Trim?.AnalogTarget;
        var verifyNames = sequence.Steps.OfType<VerifyStep>().Select(v => v.DisplayName).ToHashSet(StringComparer.Ordinal);

        var simulation = (fixture.Simulation ?? new SimulationDefinition()) with { DefectRate = 0, SensorDefectRate = 0 };
        var perfect = fixture with { Simulation = simulation };
        var sensor = ReferenceConversion.SensorOf(perfect);
        var clock = new VirtualTimeProvider(new DateTimeOffset(2026, 1, 1, 6, 0, 0, TimeSpan.Zero));
        var rig = new SimulatedRig(perfect, seed, clock, ReferenceConversion.FromCelsius(sensor));
        var factory = new SimulatedUnitFactory(seed, simulation, design);
        var sink = new CollectingSink();
        var coordinator = new BatchCoordinator(rig.Instruments, perfect, ReferenceConversion.ToCelsius(sensor), clock, sink,
            new AutoConfirmOperator(), null, NullLogger.Instance, new InstrumentTiming(), new SimulatedPartFitting(rig));
        var slots = fixture.Slots.Select(s => s.Slot).Order().ToList();

        var squares = new List<double>();
        var maxAbs = 0.0;
        var floors = new List<double>();
        var verifyTrue = new List<double>();
        var verifyRead = new List<double>();
        var predicted = new List<(double Mean, double U)>();
        var decomposition = AccuracyDecomposition.Applies(sequence) ? new AccuracyDecomposition() : null;
        for (var b = 0; b < batches; b++)
        {
            var loaded = new Dictionary<string, SimulatedUnit>(StringComparer.Ordinal);
            var loads = new List<SlotLoad>();
            foreach (var slot in slots)
            {
                var unit = factory.NextUnit();
                rig.Load(slot, unit);
                loaded[unit.Serial] = unit;
                loads.Add(new SlotLoad(slot, unit.Serial));
            }

            sink.Runs.Clear();
            await coordinator.RunAsync(
                new BatchRequest { Sequence = sequence, SequenceSha256 = "bench", Station = "bench", Loads = loads, Schedule = schedule ?? BatchSchedule.Fast }, ct)
                .ConfigureAwait(false);
            foreach (var slot in slots)
            {
                rig.Unload(slot);
            }

            foreach (var run in sink.Runs.Where(r => r.Verdict == Verdict.Pass))
            {
                var unit = loaded[run.Serial];
                var errors = unit.TrueErrorsC(grid, target);
                decomposition?.Add(sequence, unit, run, WellOffsetC(simulation, run.Slot), fixture.WellOffsetC(run.Slot), grid, errors);
                squares.AddRange(errors.Select(e => e * e));
                maxAbs = Math.Max(maxAbs, errors.Max(Math.Abs));
                if (Value(run, ".predicted.floorRms") is { } floor)
                {
                    floors.Add(floor);
                }

                if (verifyC is { } v)
                {
                    verifyTrue.Add(unit.TrueErrorsC([v], target)[0]);
                }

                var verify = run.Readings.FirstOrDefault(r => verifyNames.Contains(r.Name));
                if (verify?.Value is { } measured)
                {
                    verifyRead.Add(measured);
                }

                var prediction = run.Readings.FirstOrDefault(r => r.Name.EndsWith(".predicted.verify", StringComparison.Ordinal));
                if (prediction?.Value is { } p)
                {
                    predicted.Add((p, prediction.StandardUncertainty ?? 0));
                }
            }
        }

        var n = verifyTrue.Count;
        return new AccuracyFigures(
            sequence.Id,
            fit,
            n,
            squares.Count == 0 ? double.NaN : Math.Sqrt(squares.Average()),
            maxAbs,
            floors.Count == 0 ? double.NaN : Math.Sqrt(floors.Average(f => f * f)),
            n == 0 ? double.NaN : verifyTrue.Average(),
            verifyRead.Count == 0 ? double.NaN : verifyRead.Average(),
            Sd(verifyRead),
            predicted.Count == 0 ? double.NaN : predicted.Average(p => p.Mean),
            predicted.Count == 0 ? double.NaN : Math.Sqrt(predicted.Average(p => p.U * p.U) + Math.Pow(Sd(predicted.Select(p => p.Mean).ToList()), 2)),
            decomposition?.Stages() ?? [],
            decomposition?.Mismatches ?? 0);
    }

    /// <summary>The simulator's true offset of a slot's well from the reference well, °C.</summary>
    private static double WellOffsetC(SimulationDefinition simulation, int slot) =>
        slot >= 1 && slot <= simulation.SlotOffsetsC.Count ? simulation.SlotOffsetsC[slot - 1] : 0.0;

    private static double? Value(RunRecord run, string suffix) =>
        run.Readings.FirstOrDefault(r => r.Name.EndsWith(suffix, StringComparison.Ordinal))?.Value;

    private static double Sd(IReadOnlyList<double> values)
    {
        if (values.Count < 2)
        {
            return double.NaN;
        }

        var mean = values.Average();
        return Math.Sqrt(values.Sum(v => (v - mean) * (v - mean)) / (values.Count - 1));
    }

    private sealed class CollectingSink : IRunSink
    {
        public List<RunRecord> Runs { get; } = [];

        public Task RunEndedAsync(RunRecord run, CancellationToken cancellationToken)
        {
            Runs.Add(run);
            return Task.CompletedTask;
        }
    }
}
