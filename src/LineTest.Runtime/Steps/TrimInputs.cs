using LineTest.Core.Calibration;
using LineTest.Core.Decisions;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>The calibration points and checkpoints a trim step hands to its trim calculation.</summary>
internal static class TrimInputs
{
    /// <summary>
    /// The unit's mean (temperature, output) at each of the step's points, in the step's order: the temperature is the
    /// reference reading plus the slot's well offset from the fixture's calibration (<see cref="FixtureDefinition.WellOffsetC"/>).
    /// </summary>
    public static List<CalibrationPoint> Points(TrimStep step, UnitContext unit, FixtureDefinition fixture)
    {
        var wellOffset = fixture.WellOffsetC(unit.Slot);
        return step.Points
            .Select(p => new CalibrationPoint(p, unit.CalibrationPoints[p].ReferenceC + wellOffset, unit.CalibrationPoints[p].Output))
            .ToList();
    }

    /// <summary>Every calibration and predict-at setpoint, once, at its nominal temperature.</summary>
    public static List<TrimCheckpoint> Checkpoints(SequenceDefinition sequence, TrimStep step) =>
        step.Points.Concat(step.PredictAt).Distinct(StringComparer.Ordinal)
            .Select(p => new TrimCheckpoint(p, sequence.Setpoints.First(s => s.Name == p).Celsius))
            .ToList();

    /// <summary>
    /// The predict-at setpoints that are not calibration points (trims that predict the error at their calibration
    /// points from the measured output take only the extra temperatures as checkpoints).
    /// </summary>
    public static List<TrimCheckpoint> ExtraCheckpoints(SequenceDefinition sequence, TrimStep step) =>
        step.PredictAt.Distinct(StringComparer.Ordinal).Where(p => !step.Points.Contains(p, StringComparer.Ordinal))
            .Select(p => new TrimCheckpoint(p, sequence.Setpoints.First(s => s.Name == p).Celsius))
            .ToList();

    /// <summary>The unit's own ideality: the mean n of its I–V sweeps so far, or null when it has none.</summary>
    public static double? Ideality(UnitContext unit) => unit.Sweeps.Count == 0 ? null : unit.Sweeps.Average(s => s.Fit.Ideality);

    /// <summary>
    /// The unit's sensor curve through the step's points (<see cref="TrimAccuracy.Curve"/>), or null when the sequence
    /// states neither a sensor model nor a rated range, or the points cannot be fitted (the trim then says why).
    /// </summary>
    public static SensorCurve? Curve(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points, UnitContext unit) =>
        TrimAccuracy.Curve(sequence, points, Ideality(unit)) is { } result && result.TryGetValue(out var curve) ? curve : null;

    /// <summary>
    /// The reference and output readings of the measure step that gave each of the trim's points (the last one recorded
    /// at that setpoint), in the step's order; nulls where there is none. Only measure steps' readings count: an I–V
    /// sweep at the same setpoint also records a <c>.reference</c> reading, with other samples and another uncertainty.
    /// </summary>
    public static List<(Reading? Reference, Reading? Output)> PointReadings(SequenceDefinition sequence, TrimStep step, UnitContext unit) =>
        step.Points.Select(p =>
        {
            var names = sequence.Steps.OfType<MeasureStep>().Where(m => m.Setpoint == p).Select(m => m.DisplayName).ToHashSet(StringComparer.Ordinal);
            return (unit.Readings.LastOrDefault(r => r.Step is { } s && names.Contains(s) && r.Name == $"{s}.reference"),
                unit.Readings.LastOrDefault(r => r.Step is { } s && names.Contains(s) && r.Name == $"{s}.output"));
        }).ToList();

    /// <summary>
    /// Records the error budget over the rated range for a computed trim (<see cref="RatedRangeBudget"/>), from the
    /// reference and output readings the measure steps recorded at the trim's points; nothing without a rated range.
    /// </summary>
    public static void AddBudget(
        SequenceDefinition sequence, TrimStep step, UnitContext unit, ITrimResult trim, SensorCurve? curve, FixtureDefinition fixture, DateTimeOffset now)
    {
        if (sequence.RatedRange is not { } range || curve is null)
        {
            return;
        }

        var uncertainties = PointReadings(sequence, step, unit).Select(p =>
        {
            var scale = p.Output is not null && UnitsOfMeasure.IsKnown(p.Output.Unit) ? UnitsOfMeasure.FromBase(1, p.Output.Unit) : 1.0;
            return TrimAccuracy.PointFrom(p.Reference, p.Output, scale);
        }).ToList();
        var sweepSpread = unit.Sweeps.Count > 1
            ? Math.Sqrt(unit.Sweeps.Sum(s => Math.Pow(s.Fit.Ideality - curve.Ideality, 2)) / (unit.Sweeps.Count - 1) / unit.Sweeps.Count)
            : (double?)null;
        var prediction = RatedRangeBudget.Predict(curve, trim.IndicatedC, uncertainties, range.LowC, range.HighC, sweepSpread,
            TrimAccuracy.PartTolerance(trim), TrimAccuracy.Resolution(trim),
            soakResidualHalfWidthC: TrimAccuracy.SoakResidualHalfWidthC(sequence),
            wellUniformityHalfWidthC: fixture.Source.WellUniformityC ?? 0);
        // The further setpoints' predictions get the budget's value (the sensor curve through the points) and uncertainty.
        foreach (var checkpoint in ExtraCheckpoints(sequence, step))
        {
            var index = unit.Readings.FindLastIndex(r => r.Name == $"{step.DisplayName}.predicted.{checkpoint.Name}");
            if (index >= 0)
            {
                var at = prediction.Nearest(checkpoint.TemperatureC);
                var u = new ExpandedUncertainty(at.StandardUncertaintyC, CoverageFactor.ForDegreesOfFreedom(at.EffectiveDegreesOfFreedom));
                unit.Readings[index] = unit.Readings[index] with
                {
                    Value = trim.IndicatedC(curve.OutputAt(checkpoint.TemperatureC)) - checkpoint.TemperatureC,
                    StandardUncertainty = u.StandardUncertainty,
                    ExpandedUncertainty = u.Expanded,
                    CoverageFactor = u.CoverageFactor,
                };
            }
        }

        // With the unit's curvature fitted, a calibration point's prediction (from its measured output) carries the budget's
        // uncertainty there too: the inner point is often the verify setpoint, and the curve passes through every point.
        if (curve.CurvatureFitted)
        {
            for (var i = 0; i < step.Points.Count; i++)
            {
                var index = unit.Readings.FindLastIndex(r => r.Name == $"{step.DisplayName}.predicted.{step.Points[i]}");
                if (index >= 0)
                {
                    var at = prediction.Nearest(curve.PointsC[i]);
                    var u = new ExpandedUncertainty(at.StandardUncertaintyC, CoverageFactor.ForDegreesOfFreedom(at.EffectiveDegreesOfFreedom));
                    unit.Readings[index] = unit.Readings[index] with
                    {
                        StandardUncertainty = u.StandardUncertainty,
                        ExpandedUncertainty = u.Expanded,
                        CoverageFactor = u.CoverageFactor,
                    };
                }
            }
        }

        foreach (var reading in TrimAccuracy.Readings(step.DisplayName, range, prediction, curve, step.Points, now))
        {
            unit.Add(reading);
        }
    }

    /// <summary>
    /// Records a computed trim's predicted errors (and worst cases, where the trim gives them) and its budget over the
    /// rated range; false, with the unit's first failure reason set, when the trim is out of range and must not be applied.
    /// </summary>
    public static bool RecordPrediction(
        SequenceDefinition sequence, TrimStep step, UnitContext unit, ITrimResult trim, SensorCurve? curve, FixtureDefinition fixture, DateTimeOffset now)
    {
        var name = step.DisplayName;
        foreach (var predicted in trim.PredictedErrors)
        {
            unit.Add(UnlimitedReading.Create($"{name}.predicted.{predicted.Name}", predicted.ErrorC, "degC") with { Step = name, At = now });
            if (predicted.WorstCaseErrorC is { } worst)
            {
                unit.Add(UnlimitedReading.Create($"{name}.predicted.{predicted.Name}.worstCase", worst, "degC") with { Step = name, At = now });
            }
        }

        AddBudget(sequence, step, unit, trim, curve, fixture, now);
        if (trim.InRange)
        {
            return true;
        }

        unit.FirstFailureReason = $"trim out of range: {string.Join("; ", trim.Problems)}";
        return false;
    }

    /// <summary>Writes trim registers over the unit's link, stores them, and returns what the unit reads back.</summary>
    public static async Task<IReadOnlyDictionary<string, long>> WriteStoreReadBackAsync(
        InstrumentGateway instruments, int slot, IReadOnlyDictionary<string, long> values, CancellationToken ct)
    {
        await instruments.LinkAsync(slot, (link, token) => link.WriteTrimAsync(values, token), ct).ConfigureAwait(false);
        await instruments.DelayAsync(instruments.Timing.UnitStoreSeconds, ct).ConfigureAwait(false);
        await instruments.LinkAsync(slot, (link, token) => link.StoreAsync(token), ct).ConfigureAwait(false);
        return await instruments.LinkAsync(slot, (link, token) => link.ReadBackAsync(token), ct).ConfigureAwait(false);
    }
}
