namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>measure</c> step: reads at the settled setpoint (moves with its settle block), samples, output and its
/// limits; a firmware trim needs raw counts over the link. Time: each round reads the reference and every unit.
/// </summary>
public sealed class MeasureStepKind : StepKind<MeasureStep>
{
    /// <inheritdoc />
    public override string Word => "measure";

    /// <inheritdoc />
    public override PlannerRole PlannerRole => PlannerRole.ReadsInBlock;

    /// <inheritdoc />
    protected override void Check(MeasureStep step, StepCheckContext context)
    {
        var path = context.Path;
        context.RequireSettled(step.Setpoint);
        context.RequireSamples(step.Samples);
        var outputKnown = context.CheckOutput(step.Output);
        context.Problems.AddIf(outputKnown && context.FirmwareTrim && step.Output != UnitOutputs.Link, $"{path}.output",
            "a firmware trim is computed from the unit's raw counts: read them with \"output\": \"link\"");
        if (step.OutputLimits is { } outputLimits)
        {
            context.CheckLimits(outputLimits, $"{path}.outputLimits",
                step.Output == UnitOutputs.Link ? StepCheckContext.CountUnits : StepCheckContext.VoltageUnits);
        }

        context.Measured.Add(step.Setpoint);
    }

    /// <inheritdoc />
    protected override string? SetpointOf(MeasureStep step) => step.Setpoint;

    /// <inheritdoc />
    protected override double EstimateSeconds(MeasureStep step, StepTimeModel model) =>
        step.Samples * (model.ReferenceReadSeconds + model.Units * model.MeterReadSeconds);

    /// <inheritdoc />
    protected override string DoingText(MeasureStep step) => $"measuring at {step.Setpoint}";
}
