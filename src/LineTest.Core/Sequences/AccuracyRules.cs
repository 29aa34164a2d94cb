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
