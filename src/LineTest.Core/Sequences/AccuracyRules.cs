using System.Globalization;
using LineTest.Core.Decisions;
using LineTest.Core.Definitions;

namespace LineTest.Core.Sequences;

/// <summary>
/// The checker's rules for the accuracy fields: the rated range (finite, low below high, limits in degC), the trim's
/// fit objective, and the sensor model (positive parameters, spreads zero or more); a minimax fit needs both the rated
/// range and the sensor model, since without curvature the best line is the line through the points.
/// </summary>
internal static class AccuracyRules
{
    private static readonly string[] ErrorUnits = ["degC"];

    public static void Check(SequenceDefinition sequence, ProblemList problems)
    {
        if (sequence.RatedRange is { } range)
        {
            problems.AddIf(!double.IsFinite(range.LowC) || !double.IsFinite(range.HighC) || !(range.HighC > range.LowC), "$.ratedRange",
                "the rated range needs finite lowC and highC with highC above lowC");
            CheckLimits(range.MaxAbsErrorLimits, "$.ratedRange.maxAbsErrorLimits", problems);
            CheckLimits(range.RmsErrorLimits, "$.ratedRange.rmsErrorLimits", problems);
        }

        if (sequence.Trim is not { } trim)
        {
            return;
        }

        if (!TrimFits.All.Contains(trim.Fit, StringComparer.Ordinal))
        {
            problems.Add("$.trim.fit", $"'{trim.Fit}' is not a fit objective: use {string.Join(" or ", TrimFits.All.Select(f => $"\"{f}\""))}");
        }
        else if (trim.Fit == TrimFits.Minimax)
        {
            problems.AddIf(trim.Method == TrimMethods.Firmware, "$.trim.fit",
                "a firmware trim fits its coefficients to the sensor model over the rated range; 'minimax' is for gain-and-offset trims");
            problems.AddIf(sequence.RatedRange is null, "$.trim.fit", "'minimax' needs the sequence's 'ratedRange' to minimise the error over");
            problems.AddIf(trim.SensorModel is null, "$.trim.fit", "'minimax' needs the trim's 'sensorModel' (without curvature the best line is the line through the points)");
        }

        if (trim.SensorModel is { } model)
        {
            foreach (var (field, reason) in model.Check())
            {
                problems.Add($"$.trim.sensorModel.{field}", reason);
            }

            problems.AddIf(trim.Method == TrimMethods.Firmware && sequence.RatedRange is null, "$.trim.sensorModel",
                "a firmware trim with a sensor model fits its coefficients over the rated range: give the sequence a 'ratedRange'");
        }
    }

    /// <summary>Largest number of calibration points a gain-and-offset trim takes: two for the line, one for the curvature.</summary>
    public const int MaxLinearTrimPoints = 3;

    /// <summary>Nearest an inner calibration point may be to an outer one, as a share of the span between the outer two.</summary>
    public const double MinInnerPointShare = 0.2;

    /// <summary>
    /// The rules for a gain-and-offset trim's (DAC, resistor) calibration points: two, or three when the third measures
    /// the unit's own curvature (<see cref="Calibration.SensorCurve.FitWithCurvature"/>). With three, the trim needs the
    /// sensor model (the shape of the curvature), the points must be at three distinct temperatures, and the inner one must
    /// lie within the rated range and between 20 % and 80 % of the way from one outer point to the other, where the diode's
    /// bow is at least 64 % of its largest (a parabola's (4·s·(1 − s)) at s = 0.2 [derived]), so one point measures it.
    /// </summary>
    /// <param name="sequence">The sequence.</param>
    /// <param name="step">The trim step.</param>
    /// <param name="path">The step's JSON path.</param>
    /// <param name="problems">Where problems go.</param>
    public static void CheckTrimPoints(SequenceDefinition sequence, TrimStep step, string path, ProblemList problems)
    {
        if (sequence.Trim is not { Method: TrimMethods.Dac or TrimMethods.Resistor } trim || step.Points.Count < 3)
        {
            return;
        }

        if (step.Points.Count > MaxLinearTrimPoints)
        {
            problems.Add($"{path}.points",
                $"a {trim.Method} trim takes two calibration points, or three when the third measures the unit's curvature; {step.Points.Count} are listed");
            return;
        }

        var celsius = sequence.Setpoints.GroupBy(s => s.Name, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.First().Celsius, StringComparer.Ordinal);
        var points = step.Points.Select((name, index) => (Name: name, Index: index, Celsius: celsius.TryGetValue(name, out var c) ? c : (double?)null)).ToList();
        if (points.Any(p => p.Celsius is null || !double.IsFinite(p.Celsius.Value)) || points.Select(p => p.Name).Distinct(StringComparer.Ordinal).Count() < 3)
        {
            return; // unknown or repeated setpoints are reported where they are listed
        }

        problems.AddIf(trim.SensorModel is null, $"{path}.points",
            "a third calibration point measures the unit's curvature, which needs the trim's 'sensorModel' for the shape of the diode's bow");
        for (var i = 1; i < points.Count; i++)
        {
            var same = points.Take(i).FirstOrDefault(p => p.Celsius == points[i].Celsius);
            if (same.Name is not null)
            {
                problems.Add($"{path}.points[{points[i].Index}]", string.Create(CultureInfo.InvariantCulture,
                    $"setpoint '{points[i].Name}' is at the same temperature as '{same.Name}' ({points[i].Celsius:0.###} degC): the three calibration points need three temperatures"));
                return;
            }
        }

        var sorted = points.OrderBy(p => p.Celsius).ToList();
        var (low, inner, high) = (sorted[0], sorted[1], sorted[2]);
        var innerPath = $"{path}.points[{inner.Index}]";
        if (sequence.RatedRange is { } range && (inner.Celsius < range.LowC || inner.Celsius > range.HighC))
        {
            problems.Add(innerPath, string.Create(CultureInfo.InvariantCulture,
                $"the inner calibration point '{inner.Name}' ({inner.Celsius:0.###} degC) is outside the rated range {range.LowC:0.###} … {range.HighC:0.###} degC: it measures the curvature the trim corrects over that range"));
            return;
        }

        var share = (inner.Celsius!.Value - low.Celsius!.Value) / (high.Celsius!.Value - low.Celsius.Value);
        problems.AddIf(share < MinInnerPointShare || share > 1 - MinInnerPointShare, innerPath, string.Create(CultureInfo.InvariantCulture,
            $"the inner calibration point '{inner.Name}' ({inner.Celsius:0.###} degC) is {share * 100:0.#} % of the way from '{low.Name}' to '{high.Name}': put it between {MinInnerPointShare * 100:0} % and {(1 - MinInnerPointShare) * 100:0} %, where the diode's bow is large enough to measure"));
    }

    private static void CheckLimits(LimitSpec? limits, string path, ProblemList problems)
    {
        if (limits is null)
        {
            return;
        }

        problems.AddIf(!ErrorUnits.Contains(limits.Unit, StringComparer.Ordinal), $"{path}.unit", $"the unit must be degC, not '{limits.Unit}'");
        problems.AddIf(limits.Low is null && limits.High is null, path, "give a low or a high limit, or leave the limits out");
    }
}
