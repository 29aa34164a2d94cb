namespace LineTest.Core.Sequences.Steps;

/// <summary>What the setpoint planner (<c>Throughput/SetpointPlan</c>) may do with a step when the order is free.</summary>
public enum PlannerRole
{
    /// <summary>Never crossed: the steps before it stay before it, the steps after it stay after it.</summary>
    Barrier,

    /// <summary>Starts a settle block (brings the source to its setpoint); blocks may be reordered among themselves.</summary>
    Settle,

    /// <summary>Reads at the setpoint its block settled at, and moves with that block.</summary>
    ReadsInBlock,
}
