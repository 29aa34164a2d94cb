namespace LineTest.Rig.Instruments;

/// <summary>Kinds of instrument fault, for error Pareto and operator messages.</summary>
public enum InstrumentFaultKind
{
    /// <summary>No answer within the timeout.</summary>
    NoAnswer,

    /// <summary>A reply that could not be understood (framing, checksum, not a number).</summary>
    GarbageReply,

    /// <summary>The port disappeared or could not be opened.</summary>
    PortLost,

    /// <summary>The instrument reported an error of its own.</summary>
    InstrumentError,

    /// <summary>Anything else.</summary>
    Other,
}
