namespace LineTest.Core.Units;

/// <summary>What moves a unit from one state to the next.</summary>
public enum UnitTrigger
{
    /// <summary>An identify step begins.</summary>
    Identify,

    /// <summary>An electrical check begins.</summary>
    CheckSupply,

    /// <summary>The batch asks the source for a setpoint.</summary>
    AwaitSource,

    /// <summary>The source became stable; the soak begins.</summary>
    SourceStable,

    /// <summary>A measurement begins.</summary>
    Measure,

    /// <summary>The trim begins.</summary>
    Trim,

    /// <summary>The verify measurement begins.</summary>
    Verify,

    /// <summary>The operator is prompted.</summary>
    Prompt,

    /// <summary>Every step done with every reading within limits.</summary>
    Complete,

    /// <summary>A reading outside limits or a trim out of range (carries the reason).</summary>
    Reject,

    /// <summary>An instrument or the unit failed (carries the reason).</summary>
    Fault,

    /// <summary>The operator or the station cancelled (carries the reason).</summary>
    Cancel,
}
