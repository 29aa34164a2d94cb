using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>Runs the steps of one kind for a batch. Registered in <see cref="StepExecutors"/>; derive from <see cref="StepExecutor{TStep}"/>.</summary>
internal interface IStepExecutor
{
    /// <summary>The step record this executor runs.</summary>
    Type StepType { get; }

    /// <summary>Runs <paramref name="step"/> for the batch's units still in progress.</summary>
    Task RunAsync(StepContext context, StepDefinition step, CancellationToken ct);
}
