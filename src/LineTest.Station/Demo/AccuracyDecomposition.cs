using LineTest.Core.Calibration;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Rig.Simulation;

namespace LineTest.Station.Demo;

/// <summary>
/// Where a gain-and-offset trim's true error over the rated range comes from, from the simulator's ground truth: the
/// unit's true untrimmed output V(T) (<see cref="SimulatedUnit.CalibrationOutputVolts"/>) is trimmed again and again with
/// one more error source each time, and each stage's error is read as (V(T) − line(T))/slope for a trim that maps the
/// line exactly (continuous codes), then with the codes or parts the station chose, then as the part really is.
/// </summary>
/// <remarks>
/// Stages: (1) <c>best line</c>: the line the fit objective would choose from the true curve itself (minimax over the
/// range, or through the true outputs at the calibration temperatures) — the floor of a straight-line trim;
/// (2) <c>sensor model</c>: the station's curve (nominal XTI, no read-out non-linearity, the unit's measured n; with a
/// third calibration point the unit's own curvature fitted to the three) through the true outputs at the reference
/// temperatures; (3) <c>well offset</c>: the unit's well is not the reference's
/// (the simulator's static slot offset, less what the fixture states for the slot and the station corrects); (4) <c>soak lag, noise, reference</c>: the measured points themselves (what is
/// left: the unit still following its well, output and reference noise); (5) <c>trim resolution</c>: the codes rounded or
/// the E-series parts chosen (the trim's own prediction applied to the true curve); (6) <c>as built</c>: the unit's
/// real DAC steps (what the sequence's DAC check leaves of them) or the fitted parts' tolerance (the simulator's truth).
/// </remarks>
public sealed class AccuracyDecomposition
{
    /// <summary>The stage names, in order.</summary>
    public static readonly IReadOnlyList<string> StageNames =
        ["best line", "sensor model", "well offset", "soak lag, noise, reference", "trim resolution", "as built (after DAC check)"];

    private readonly List<double[]>[] _errors = StageNames.Select(_ => new List<double[]>()).ToArray();

    /// <summary>Units whose recomputed trim differs from the one the station wrote (should stay 0).</summary>
    public int Mismatches { get; private set; }

    /// <summary>Whether the decomposition applies: a DAC or resistor trim and a rated range.</summary>
    public static bool Applies(SequenceDefinition sequence)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        return sequence.RatedRange is not null && sequence.Trim is { Method: TrimMethods.Dac or TrimMethods.Resistor }
            && sequence.Steps.OfType<TrimStep>().Any();
    }

    /// <summary>Adds one passing unit.</summary>
    /// <param name="sequence">The sequence variant it ran.</param>
    /// <param name="unit">The simulated part.</param>
    /// <param name="run">Its stored run.</param>
    /// <param name="wellOffsetC">Its well's true offset from the reference well, °C.</param>
    /// <param name="statedWellOffsetC">The offset the fixture states for its slot (which the station corrected), °C.</param>
    /// <param name="grid">The rated-range temperatures, °C.</param>
    /// <param name="actual">The unit's true error as shipped at <paramref name="grid"/>, °C.</param>
    public void Add(
        SequenceDefinition sequence, SimulatedUnit unit, RunRecord run, double wellOffsetC, double statedWellOffsetC, double[] grid, double[] actual)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(unit);
        ArgumentNullException.ThrowIfNull(run);
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(actual);
        var range = sequence.RatedRange!;
        var step = sequence.Steps.OfType<TrimStep>().First();
        var measured = step.Points.Select(p => Point(sequence, run, p, statedWellOffsetC)).ToList();
        var ideality = IdealityOf(sequence, run);
        Func<double, double> truth = unit.CalibrationOutputVolts;

        // Through the points, the best line from the true curve is the station's line through the true outputs.
        var exact = StationLine(sequence, measured.Select(p => p with { Output = truth(p.ReferenceC) }).ToList(), ideality);
        var best = sequence.Trim!.Fit == TrimFits.Minimax ? Minimax(truth, range.LowC, range.HighC) : exact;
        var well = StationLine(sequence, measured.Select(p => p with { Output = truth(p.ReferenceC - statedWellOffsetC + wellOffsetC) }).ToList(), ideality);
        var stationLine = StationTrimLine(sequence, measured, ideality);
        var station = stationLine is null ? ((double A, double B)?)null : (stationLine.Intercept, stationLine.Slope);
        var trim = Trim(sequence, measured, stationLine);
        if (trim is null || best is null || exact is null || well is null || station is null)
        {
            Mismatches++;
            return;
        }

        if (!SameAsWritten(trim, run.Trim))
        {
            Mismatches++;
        }

        _errors[0].Add(Continuous(best.Value));
        _errors[1].Add(Continuous(exact.Value));
        _errors[2].Add(Continuous(well.Value));
        _errors[3].Add(Continuous(station.Value));
        _errors[4].Add(grid.Select(t => trim.IndicatedC(truth(t)) - t).ToArray());
        _errors[5].Add(actual);

        double[] Continuous((double A, double B) line) => grid.Select(t => (truth(t) - line.A - (line.B * t)) / line.B).ToArray();
    }

    /// <summary>The stages over every unit added.</summary>
    public IReadOnlyList<AccuracyStage> Stages()
    {
        var stages = new List<AccuracyStage>();
        for (var s = 0; s < StageNames.Count; s++)
        {
            var all = _errors[s].SelectMany(e => e).ToList();
            var steps = s == 0
                ? all
                : _errors[s].Zip(_errors[s - 1], (now, before) => now.Zip(before, (x, y) => x - y)).SelectMany(d => d).ToList();
            stages.Add(new AccuracyStage(StageNames[s], Max(all), Rms(all), Max(steps), Rms(steps)));
        }

        return stages;
    }

    private static double Max(List<double> values) => values.Count == 0 ? double.NaN : values.Max(Math.Abs);

    private static double Rms(List<double> values) => values.Count == 0 ? double.NaN : Math.Sqrt(values.Average(v => v * v));

    private static CalibrationPoint Point(SequenceDefinition sequence, RunRecord run, string setpoint, double statedWellOffsetC)
    {
        var measure = sequence.Steps.OfType<MeasureStep>().Last(m => m.Setpoint == setpoint).DisplayName;
        var reference = run.Readings.Last(r => r.Name == $"{measure}.reference");
        var output = run.Readings.Last(r => r.Name == $"{measure}.output");
        var volts = UnitsOfMeasure.IsKnown(output.Unit) ? output.Value!.Value / UnitsOfMeasure.FromBase(1, output.Unit) : output.Value!.Value;
        return new CalibrationPoint(setpoint, reference.Value!.Value + statedWellOffsetC, volts);
    }

    private static double? IdealityOf(SequenceDefinition sequence, RunRecord run)
    {
        var names = sequence.Steps.OfType<IvSweepStep>().Select(s => $"{s.DisplayName}.n").ToHashSet(StringComparer.Ordinal);
        var values = run.Readings.Where(r => names.Contains(r.Name) && r.Value is not null).Select(r => r.Value!.Value).ToList();
        return values.Count == 0 ? null : values.Average();
    }

    private static (double A, double B)? Minimax(Func<double, double> f, double low, double high)
    {
        var line = MinimaxLine.Fit(f, low, high);
        return (line.Intercept, line.Slope);
    }

    private static (double A, double B)? StationLine(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points, double? ideality) =>
        StationTrimLine(sequence, points, ideality) is { } line ? (line.Intercept, line.Slope) : null;

    /// <summary>The line the station's trim maps, with its curve's output (null when there is no curve or line).</summary>
    private static TrimLine? StationTrimLine(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points, double? ideality)
    {
        var curve = TrimAccuracy.Curve(sequence, points, ideality) is { } result && result.TryGetValue(out var c) ? c : null;
        return TrimAccuracy.Line(sequence, curve, points);
    }

    private static ITrimResult? Trim(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points, TrimLine? line)
    {
        var trim = sequence.Trim!;
        if (trim.Dac is { } dac)
        {
            return DacTrim.Compute(dac, points, dac.Gain.Nominal, dac.Offset.Nominal, [], line, TrimAccuracy.CodeObjectiveC(sequence, points)).TryGetValue(out var d) ? d : null;
        }

        return trim.Resistor is { } resistor && ResistorTrim.Compute(resistor, points, [], line).TryGetValue(out var res) ? res : null;
    }

    private static bool SameAsWritten(ITrimResult trim, TrimRecord? written)
    {
        if (written is null)
        {
            return false;
        }

        // A DAC check may have moved the codes after the trim was computed; compare with what was computed.
        var computed = new Dictionary<string, double>(written.Values, StringComparer.Ordinal);
        foreach (var key in new[] { "gainCode", "offsetCode" })
        {
            if (written.Inputs.TryGetValue($"computed.{key}", out var before))
            {
                computed[key] = before;
            }
        }

        var mine = trim.ToRecord().Values;
        return mine.All(kv => computed.TryGetValue(kv.Key, out var v) && Math.Abs(v - kv.Value) <= 1e-9 * Math.Max(1, Math.Abs(v)));
    }
}
