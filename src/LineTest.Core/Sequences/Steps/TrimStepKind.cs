namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>trim</c> step: needs the sequence's trim object and two or more measured, distinct calibration points (a
/// gain-and-offset trim two or three: <see cref="AccuracyRules.CheckTrimPoints"/>); predict-at setpoints must exist. Never crossed by the planner (a verify block stays after its trim). Computing and
/// writing a trim takes well under a second per unit, so it adds nothing to the bound.
/// </summary>
public sealed class TrimStepKind : StepKind<TrimStep>
{
    /// <inheritdoc />
    public override string Word => "trim";

    /// <inheritdoc />
    protected override void Check(TrimStep step, StepCheckContext context)
    {
        var path = context.Path;
        var problems = context.Problems;
        context.Trimmed = true;
        problems.AddIf(context.Sequence.Trim is null, path, "a trim step needs the sequence's 'trim' object (method and parameters)");
        problems.AddIf(step.Points.Count < 2, $"{path}.points", "a trim needs calibration points from two setpoints or more");
        var distinct = new HashSet<string>(StringComparer.Ordinal);
        for (var p = 0; p < step.Points.Count; p++)
        {
            var point = step.Points[p];
            var pointPath = $"{path}.points[{p}]";
            if (context.RequireSetpoint(point, pointPath))
            {
                problems.AddIf(!context.Measured.Contains(point), pointPath,
                    $"setpoint '{point}' has no measure step before this trim step");
                problems.AddIf(!distinct.Add(point), pointPath, $"setpoint '{point}' is listed twice");
            }
        }

        for (var p = 0; p < step.PredictAt.Count; p++)
        {
            context.RequireSetpoint(step.PredictAt[p], $"{path}.predictAt[{p}]");
        }

        AccuracyRules.CheckTrimPoints(context.Sequence, step, path, problems);
    }

    /// <inheritdoc />
    protected override string DoingText(TrimStep step) => "trimming";
}
