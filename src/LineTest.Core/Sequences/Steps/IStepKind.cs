namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// Everything the core knows about one step kind, in one place: its checks, the setpoint it uses, what the setpoint
/// planner may do with it, its time estimate and the words the operator screen shows. Registered in
/// <see cref="StepKinds"/>; derive from <see cref="StepKind{TStep}"/>.
/// </summary>
public interface IStepKind
{
    /// <summary>The step record this kind describes.</summary>
    Type StepType { get; }

    /// <summary>The kind word of the JSON file (<c>"kind": "measure"</c>).</summary>
    string Word { get; }

    /// <summary>What the setpoint planner may do with a step of this kind.</summary>
    PlannerRole PlannerRole { get; }

    /// <summary>Whether the step needs no stable source, so the first setpoint may already be ramping while it runs.</summary>
    bool RunsWhileSourceRamps { get; }

    /// <summary>Checks one step at <see cref="StepCheckContext.Path"/>, and records what it does for the steps after it.</summary>
    void Check(StepDefinition step, StepCheckContext context);

    /// <summary>The setpoint the step brings the source to or reads at, or null when it does not depend on one.</summary>
    string? SetpointOf(StepDefinition step);

    /// <summary>
    /// The least time the step adds at its setpoint for a batch of good units, seconds, with the instruments paced as
    /// in <paramref name="model"/> (settling itself is the thermal bound's travel, window and soak: 0 here).
    /// </summary>
    double EstimateSeconds(StepDefinition step, StepTimeModel model);

    /// <summary>What the station is doing during the step, in the operator's words (e.g. "measuring at cal-low").</summary>
    string DoingText(StepDefinition step);
}
