namespace LineTest.Core.Sequences.Steps;

/// <summary>The <c>identify</c> step: nothing to check; needs no stable source.</summary>
public sealed class IdentifyStepKind : StepKind<IdentifyStep>
{
    /// <inheritdoc />
    public override string Word => "identify";

    /// <inheritdoc />
    public override bool RunsWhileSourceRamps => true;

    /// <inheritdoc />
    protected override void Check(IdentifyStep step, StepCheckContext context)
    {
    }

    /// <inheritdoc />
    protected override string DoingText(IdentifyStep step) => "identifying";
}
