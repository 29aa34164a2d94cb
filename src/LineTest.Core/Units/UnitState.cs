namespace LineTest.Core.Units;

/// <summary>Where one unit is in its run. Plain words: these are shown to the operator.</summary>
public enum UnitState
{
    /// <summary>Superstate of every state in which the run is still going.</summary>
    InProgress,

    /// <summary>Scanned into a slot, waiting for the batch to start.</summary>
    Loaded,

    /// <summary>Asking the unit who it is.</summary>
    Identifying,

    /// <summary>Electrical checks (supply current).</summary>
    CheckingSupply,

    /// <summary>The source is heading for a setpoint; waiting until it is stable.</summary>
    WaitingForSource,

    /// <summary>The source is stable; the unit is following it.</summary>
    Soaking,

    /// <summary>Reading the reference and the unit.</summary>
    Measuring,

    /// <summary>Computing, writing and reading back the trim.</summary>
    Trimming,

    /// <summary>Checking the trimmed unit at a check setpoint.</summary>
    Verifying,

    /// <summary>Waiting for the operator to do something.</summary>
    AwaitingOperator,

    /// <summary>Finished: every reading within limits.</summary>
    Passed,

    /// <summary>Finished: a reading outside limits, or a trim out of range.</summary>
    Failed,

    /// <summary>Finished: the test could not be completed (fault, not answering, cancelled). Never a pass.</summary>
    Errored,
}
