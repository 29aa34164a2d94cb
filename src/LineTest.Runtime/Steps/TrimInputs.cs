using LineTest.Core.Calibration;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Steps;

/// <summary>The calibration points and checkpoints a trim step hands to its trim calculation.</summary>
internal static class TrimInputs
{
    /// <summary>The unit's mean (reference, output) at each of the step's points, in the step's order.</summary>
    public static List<CalibrationPoint> Points(TrimStep step, UnitContext unit) =>
        step.Points
            .Select(p => new CalibrationPoint(p, unit.CalibrationPoints[p].ReferenceC, unit.CalibrationPoints[p].Output))
            .ToList();

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
}
