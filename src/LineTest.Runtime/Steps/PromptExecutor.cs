using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>Runs a <see cref="PromptStep"/>: every unit shows as awaiting the operator while the prompt is shown.</summary>
internal sealed class PromptExecutor : StepExecutor<PromptStep>
{
    protected override async Task RunAsync(StepContext context, PromptStep step, CancellationToken ct)
    {
        foreach (var unit in context.Batch.Active)
        {
            unit.Machine.BeginPrompt();
            context.Notify(unit);
        }

        await context.Operator.PromptAsync(step.Text, step.Confirm, ct).ConfigureAwait(false);
    }
}
