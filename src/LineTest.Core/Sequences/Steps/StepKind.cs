namespace LineTest.Core.Sequences.Steps;

/// <summary>The typed base of a step-kind descriptor: implement the members for <typeparamref name="TStep"/> only.</summary>
/// <typeparam name="TStep">The step record.</typeparam>
public abstract class StepKind<TStep> : IStepKind
    where TStep : StepDefinition
{
    /// <inheritdoc />
    public Type StepType => typeof(TStep);

    /// <inheritdoc />
    public abstract string Word { get; }

    /// <inheritdoc />
    public virtual PlannerRole PlannerRole => PlannerRole.Barrier;

    /// <inheritdoc />
    public virtual bool RunsWhileSourceRamps => false;

    /// <inheritdoc />
    public void Check(StepDefinition step, StepCheckContext context) => Check(As(step), context);

    /// <inheritdoc />
    public string? SetpointOf(StepDefinition step) => SetpointOf(As(step));

    /// <inheritdoc />
    public double EstimateSeconds(StepDefinition step, StepTimeModel model) => EstimateSeconds(As(step), model);

    /// <inheritdoc />
    public string DoingText(StepDefinition step) => DoingText(As(step));

    /// <summary>Checks a step of this kind.</summary>
    protected abstract void Check(TStep step, StepCheckContext context);

    /// <summary>The setpoint of a step of this kind, or null.</summary>
    protected virtual string? SetpointOf(TStep step) => null;

    /// <summary>The least time a step of this kind adds at its setpoint, seconds.</summary>
    protected virtual double EstimateSeconds(TStep step, StepTimeModel model) => 0;

    /// <summary>The operator's words for a step of this kind.</summary>
    protected abstract string DoingText(TStep step);

    private static TStep As(StepDefinition step)
    {
        ArgumentNullException.ThrowIfNull(step);
        return step as TStep
            ?? throw new ArgumentException($"A '{step.Kind}' step was given to the descriptor of {typeof(TStep).Name}.", nameof(step));
    }
}
