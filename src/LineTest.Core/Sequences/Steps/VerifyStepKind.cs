namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>verify</c> step: reads at the settled setpoint (moves with its settle block), after the trim it confirms;
/// limits on a temperature difference; a firmware-trimmed unit is verified over its link. Time as a measure step.
/// </summary>
public sealed class VerifyStepKind : StepKind<VerifyStep>
{
    /// <inheritdoc />
    public override string Word => "verify";

    /// <inheritdoc />
    public override PlannerRole PlannerRole => PlannerRole.ReadsInBlock;

    /// <inheritdoc />
    protected override void Check(VerifyStep step, StepCheckContext context)
    {
        var path = context.Path;
        context.RequireSettled(step.Setpoint);
        context.RequireSamples(step.Samples);
        var outputKnown = context.CheckOutput(step.Output);
        context.Problems.AddIf(outputKnown && context.FirmwareTrim && step.Output != UnitOutputs.Link, $"{path}.output",
            "a firmware-trimmed unit reports its temperature itself: verify it with \"output\": \"link\"");
        context.CheckLimits(step.Limits, $"{path}.limits", StepCheckContext.TemperatureDifferenceUnits);
        context.Problems.AddIf(context.Sequence.Trim is not null && !context.Trimmed, path,
            "a verify step must come after the trim step (it confirms the trim)");
    }

    /// <inheritdoc />
    protected override string? SetpointOf(VerifyStep step) => step.Setpoint;

    /// <inheritdoc />
    protected override double EstimateSeconds(VerifyStep step, StepTimeModel model) =>
        step.Samples * (model.ReferenceReadSeconds + model.Units * model.MeterReadSeconds);

    /// <inheritdoc />
    protected override string DoingText(VerifyStep step) => $"verifying at {step.Setpoint}";
}
