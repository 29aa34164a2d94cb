namespace LineTest.Core.Sequences.Steps;

/// <summary>
/// The <c>settle</c> step: its setpoint must exist; it starts a settle block the planner may move. Its time is the
/// thermal bound's travel, stability window and soak, not an estimate of its own.
/// </summary>
public sealed class SettleStepKind : StepKind<SettleStep>
{
    /// <inheritdoc />
    public override string Word => "settle";

    /// <inheritdoc />
    public override PlannerRole PlannerRole => PlannerRole.Settle;

    /// <inheritdoc />
    protected override void Check(SettleStep step, StepCheckContext context)
    {
        // Remember even an unknown setpoint (see StepCheckContext.SettledAt).
        context.RequireSetpoint(step.Setpoint, $"{context.Path}.setpoint");
        context.SettledAt = step.Setpoint;
    }

    /// <inheritdoc />
    protected override string? SetpointOf(SettleStep step) => step.Setpoint;

    /// <inheritdoc />
    protected override string DoingText(SettleStep step) => $"bringing the block to {step.Setpoint}";
}
