namespace LineTest.Core.Sequences.Steps;

/// <summary>The <c>prompt</c> step: its text must not be empty. Its time is the operator's, so no estimate.</summary>
public sealed class PromptStepKind : StepKind<PromptStep>
{
    /// <inheritdoc />
    public override string Word => "prompt";

    /// <inheritdoc />
    protected override void Check(PromptStep step, StepCheckContext context) =>
        context.Problems.AddIf(string.IsNullOrWhiteSpace(step.Text), $"{context.Path}.text", "the prompt text must not be empty");

    /// <inheritdoc />
    protected override string DoingText(PromptStep step) => "waiting for you";
}
