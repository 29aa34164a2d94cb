using System.Globalization;
using LineTest.Core.Decisions;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;

namespace LineTest.Core.Calibration;

/// <summary>
/// Ties a sequence's accuracy fields to a trim: the unit's <see cref="SensorCurve"/>, the line a gain-and-offset trim
/// maps (through the points or minimax over the rated range), the model samples a firmware polynomial is fitted to, and
/// the readings of the error budget over the rated range (<see cref="RatedRangeBudget"/>).
/// </summary>
public static class TrimAccuracy
{
    /// <summary>
    /// The unit's curve through <paramref name="points"/> with the trim's sensor model (a straight line without one);
    /// null when the sequence has neither a sensor model nor a rated range (nothing to do). A gain-and-offset trim
    /// (DAC, resistor) with a sensor model and three calibration points fits the unit's own curvature to them
    /// (<see cref="SensorCurve.FitWithCurvature"/>); otherwise the curvature is the model's.
    /// </summary>
    public static CalculationResult<SensorCurve>? Curve(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points, double? unitIdeality)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(points);
        if (sequence.Trim?.SensorModel is null && sequence.RatedRange is null)
        {
            return null;
        }

        return FitsUnitCurvature(sequence, points.Count)
            ? SensorCurve.FitWithCurvature(points, sequence.Trim!.SensorModel!, unitIdeality)
            : SensorCurve.Fit(points, sequence.Trim?.SensorModel, unitIdeality);
    }

    /// <summary>
    /// Whether a trim with <paramref name="pointCount"/> calibration points fits each unit's own curvature: a
    /// gain-and-offset trim (DAC or resistor) with a sensor model and three points (the checker allows no more).
    /// </summary>
    public static bool FitsUnitCurvature(SequenceDefinition sequence, int pointCount)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        return pointCount >= 3 && sequence.Trim is { Method: TrimMethods.Dac or TrimMethods.Resistor, SensorModel: not null };
    }

    /// <summary>
    /// The two outer calibration points (lowest and highest temperature): the points a <c>through-points</c>
    /// gain-and-offset line goes through. With two points, both.
    /// </summary>
    public static IReadOnlyList<CalibrationPoint> OuterPoints(IReadOnlyList<CalibrationPoint> points)
    {
        ArgumentNullException.ThrowIfNull(points);
        return points.Count <= 2 ? points : [points.MinBy(p => p.ReferenceC)!, points.MaxBy(p => p.ReferenceC)!];
    }

    /// <summary>
    /// The line a DAC or resistor trim maps onto its target: minimax over the rated range of the unit's curve for
    /// <c>"fit": "minimax"</c>, otherwise the line through the two outer points (<see cref="OuterPoints"/>: with three
    /// points the middle one only measures the curvature, and its error is recorded, not spread over the line); either
    /// way with the curve's output for predictions.
    /// </summary>
    public static TrimLine? Line(SequenceDefinition sequence, SensorCurve? curve, IReadOnlyList<CalibrationPoint> points)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(points);
        if (curve is null)
        {
            return null;
        }

        if (sequence.Trim?.Fit == TrimFits.Minimax && sequence.RatedRange is { } range)
        {
            var best = curve.MinimaxLine(range.LowC, range.HighC);
            return new TrimLine(best.Intercept, best.Slope, curve.OutputAt);
        }

        return CalibrationFit.OutputVersusTemperature(OuterPoints(points)).TryGetValue(out var fit)
            ? new TrimLine(fit.Intercept, fit.Slope, curve.OutputAt)
            : null;
    }

    /// <summary>Evenly spaced temperatures over the rated range at which a DAC trim's codes are judged.</summary>
    public const int CodeObjectiveSamples = 121;

    /// <summary>
    /// Where a DAC trim's two codes are chosen together (<see cref="Trims.DacCodeSearch"/>), °C: for <c>"fit": "minimax"</c>
    /// over the rated range (the fit's own objective, now on whole codes), for <c>through-points</c> at the outer
    /// calibration points (<see cref="OuterPoints"/>); null (each code rounded on its own) when the sequence states neither a sensor model nor a rated range.
    /// </summary>
    public static IReadOnlyList<double>? CodeObjectiveC(SequenceDefinition sequence, IReadOnlyList<CalibrationPoint> points)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(points);
        if (sequence.Trim?.SensorModel is null && sequence.RatedRange is null)
        {
            return null;
        }

        return sequence.Trim?.Fit == TrimFits.Minimax && sequence.RatedRange is { } range
            ? Enumerable.Range(0, CodeObjectiveSamples).Select(i => range.LowC + ((range.HighC - range.LowC) * i / (CodeObjectiveSamples - 1))).ToArray()
            : OuterPoints(points).Select(p => p.ReferenceC).ToArray();
    }

    /// <summary>Samples of the curve over the rated range for a firmware polynomial, or null (fit the calibration points).</summary>
    public static IReadOnlyList<CalibrationPoint>? FirmwareFitPoints(SequenceDefinition sequence, SensorCurve? curve)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        return curve?.Model is not null && sequence.RatedRange is { } range ? curve.Samples(range.LowC, range.HighC) : null;
    }

    /// <summary>
    /// The standard uncertainty of a trim's resolution at a temperature, °C, for the floor: DAC offset and gain steps
    /// (rectangular, u = step/√12; the gain step pivots about 0 °C, where the offset is set), firmware coefficient LSBs
    /// (the bound/√3); none for resistors, whose chosen values are known and whose tolerance is a per-unit component.
    /// </summary>
    public static Func<double, double>? Resolution(ITrimResult trim)
    {
        ArgumentNullException.ThrowIfNull(trim);
        return trim switch
        {
            DacTrimResult dac => t =>
            {
                var offsetC = dac.Spec.Offset.Step / Math.Abs(dac.Spec.Target.SlopeVoltsPerC);
                var gainC = dac.Spec.Gain.Step * Math.Abs(t);
                return Math.Sqrt(((offsetC * offsetC) + (gainC * gainC)) / 12);
            },
            FirmwareTrimResult firmware => _ => firmware.QuantisationBoundC / Math.Sqrt(3),
            _ => null,
        };
    }

    /// <summary>
    /// Bound on the unit's lag behind its well when the soak ends, °C: the soak's drift limit times the sensor model's
    /// thermal time constant (a first-order lag drifting at r is r·τ from where it is going); 0 when either is not stated.
    /// </summary>
    public static double SoakResidualHalfWidthC(SequenceDefinition sequence)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        return sequence.Trim?.SensorModel?.ThermalTimeConstantSeconds is { } tau && double.IsFinite(sequence.Soak.MaxDriftCPerMinute)
            ? Math.Abs(sequence.Soak.MaxDriftCPerMinute) / 60 * tau
            : 0;
    }

    /// <summary>Fitted-part tolerance as a standard uncertainty, °C: the largest worst-case excess over the nominal error, /√3.</summary>
    public static Func<double, double>? PartTolerance(ITrimResult trim)
    {
        ArgumentNullException.ThrowIfNull(trim);
        var excess = trim.PredictedErrors.Where(e => e.WorstCaseErrorC is not null).Select(e => e.WorstCaseErrorC!.Value - Math.Abs(e.ErrorC)).DefaultIfEmpty(0).Max();
        return excess > 0 ? _ => excess / Math.Sqrt(3) : null;
    }

    /// <summary>
    /// The point uncertainties from the readings a measure step recorded at a setpoint: the reference reading's standard
    /// uncertainty (certificate-dominated: ν infinite) and the output reading's (ν = samples − 1, the Type A part; this
    /// understates ν where the meter's specification dominates, which errs towards a larger k).
    /// </summary>
    public static PointUncertainty PointFrom(Reading? reference, Reading? output, double outputScale = 1.0)
    {
        double? nu = output?.Samples is > 1 and var n ? n - 1 : null;
        return new PointUncertainty(reference?.StandardUncertainty ?? 0.0, null, (output?.StandardUncertainty ?? 0.0) / outputScale, nu);
    }

    /// <summary>
    /// The readings of the budget for the trim step <paramref name="name"/>: <c>.predicted.maxAbs</c> (U at the worst
    /// point), <c>.predicted.maxAbsAtC</c>, <c>.predicted.rms</c>, <c>.predicted.floorRms</c>, and with more than two
    /// calibration points each point's residual from the sensor curve, <c>.model.residual.&lt;setpoint&gt;</c> (°C). With
    /// the unit's curvature fitted (<see cref="SensorCurve.CurvatureFitted"/>) instead: <c>.model.curvature</c> (λ, the
    /// unit's bow over the model's) and each inner point's residual from the model's nominal curve through the outer
    /// points, <c>.model.residual.&lt;setpoint&gt;</c> (°C; what λ was fitted to).
    /// </summary>
    public static IReadOnlyList<Reading> Readings(
        string name, RatedRangeDefinition range, RatedRangePrediction prediction, SensorCurve curve, IReadOnlyList<string> pointNames, DateTimeOffset at)
    {
        ArgumentNullException.ThrowIfNull(range);
        ArgumentNullException.ThrowIfNull(prediction);
        ArgumentNullException.ThrowIfNull(curve);
        ArgumentNullException.ThrowIfNull(pointNames);
        var worst = prediction.Worst;
        var readings = new List<Reading>
        {
            Judged($"{name}.predicted.maxAbs", prediction.MaxAbsErrorC, range.MaxAbsErrorLimits, prediction.WorstUncertainty, at) with
            {
                Note = string.Create(CultureInfo.InvariantCulture,
                    $"largest predicted |error| over {range.LowC:0.##}…{range.HighC:0.##} degC is {worst.ErrorC:+0.000;-0.000} degC at {worst.Celsius:0.#} degC"),
            },
            Unjudged($"{name}.predicted.maxAbsAtC", worst.Celsius, at),
            Judged($"{name}.predicted.rms", prediction.RmsErrorC, range.RmsErrorLimits, prediction.RmsUncertainty, at),
            Unjudged($"{name}.predicted.floorRms", prediction.FloorRmsC, at),
        };
        if (curve.CurvatureFitted)
        {
            readings.Add(new Reading($"{name}.model.curvature", curve.CurvatureScale, "1", null, null, Verdict.Pass)
            {
                At = at,
                Note = string.Create(CultureInfo.InvariantCulture,
                    $"this unit's diode bow is {curve.CurvatureScale:0.000} x the sensor model's (XTI*n {curve.CurvatureScale * (curve.Model?.Xti ?? 0) * curve.Ideality:0.000} equivalent)"),
            });
            var outer = (Low: curve.PointsC.Min(), High: curve.PointsC.Max());
            for (var i = 0; i < curve.ResidualsFromNominalBow.Count && i < pointNames.Count; i++)
            {
                if (curve.PointsC[i] != outer.Low && curve.PointsC[i] != outer.High)
                {
                    readings.Add(Unjudged($"{name}.model.residual.{pointNames[i]}", curve.ResidualsFromNominalBow[i] / curve.Slope, at));
                }
            }
        }
        else if (curve.Residuals.Count > 2)
        {
            for (var i = 0; i < curve.Residuals.Count && i < pointNames.Count; i++)
            {
                readings.Add(Unjudged($"{name}.model.residual.{pointNames[i]}", curve.Residuals[i] / curve.Slope, at));
            }
        }

        return readings.Select(r => r with { Step = name }).ToList();
    }

    private static Reading Judged(string name, double value, LimitSpec? limits, ExpandedUncertainty u, DateTimeOffset at) => limits is null
        ? new Reading(name, value, "degC", null, null, Verdict.Pass)
        {
            StandardUncertainty = u.StandardUncertainty, ExpandedUncertainty = u.Expanded, CoverageFactor = u.CoverageFactor, At = at,
        }
        : ReadingFactory.Create(name, value, limits, u, null, at);

    private static Reading Unjudged(string name, double value, DateTimeOffset at) => new(name, value, "degC", null, null, Verdict.Pass) { At = at };
}
