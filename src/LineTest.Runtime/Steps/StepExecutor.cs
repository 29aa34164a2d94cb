using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>The typed base of a step executor.</summary>
/// <typeparam name="TStep">The step record.</typeparam>
internal abstract class StepExecutor<TStep> : IStepExecutor
    where TStep : StepDefinition
{
    public Type StepType => typeof(TStep);

    public Task RunAsync(StepContext context, StepDefinition step, CancellationToken ct) =>
        RunAsync(context, step as TStep ?? throw new ArgumentException($"A '{step.Kind}' step was given to the executor of {typeof(TStep).Name}.", nameof(step)), ct);

    /// <summary>
    /// Runs a step of this kind. A batch-wide step (settle, measure) handles every unit itself; a per-unit step runs
    /// through <see cref="StepContext.ForEachUnitAsync"/> so a unit fault ends that unit only.
    /// </summary>
    protected abstract Task RunAsync(StepContext context, TStep step, CancellationToken ct);
}
