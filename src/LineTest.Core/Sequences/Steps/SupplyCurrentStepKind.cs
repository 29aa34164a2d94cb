namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>supply-current</c> step: samples and limits of a current. Needs no stable source; its few meter readings run
/// while the first setpoint ramps, so it adds nothing to the thermal bound.
/// </summary>
public sealed class SupplyCurrentStepKind : StepKind<SupplyCurrentStep>
{
    /// <inheritdoc />
    public override string Word => "supply-current";

    /// <inheritdoc />
    public override bool RunsWhileSourceRamps => true;

    /// <inheritdoc />
    protected override void Check(SupplyCurrentStep step, StepCheckContext context)
    {
        context.RequireSamples(step.Samples);
        context.CheckLimits(step.Limits, $"{context.Path}.limits", StepCheckContext.CurrentUnits);
    }

    /// <inheritdoc />
    protected override string DoingText(SupplyCurrentStep step) => "checking supply";
}
