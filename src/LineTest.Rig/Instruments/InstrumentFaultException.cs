namespace LineTest.Rig.Instruments;

/// <summary>
/// An instrument or unit link could not complete a command: no answer, a garbage reply, a lost port,
/// or an error the instrument reported. Message is written for a person who can act on it.
/// </summary>
public sealed class InstrumentFaultException : Exception
{
    public InstrumentFaultException(string instrument, InstrumentFaultKind kind, string message)
        : base($"{instrument}: {message}")
    {
        Instrument = instrument;
        Kind = kind;
    }

    public InstrumentFaultException(string instrument, InstrumentFaultKind kind, string message, Exception inner)
        : base($"{instrument}: {message}", inner)
    {
        Instrument = instrument;
        Kind = kind;
    }

    public InstrumentFaultException()
        : this("instrument", InstrumentFaultKind.Other, "fault")
    {
    }

    public InstrumentFaultException(string message)
        : this("instrument", InstrumentFaultKind.Other, message)
    {
    }

    public InstrumentFaultException(string message, Exception innerException)
        : this("instrument", InstrumentFaultKind.Other, message, innerException)
    {
    }

    /// <summary>Which instrument, e.g. <c>source</c>, <c>meter</c>, <c>unit slot 3</c>.</summary>
    public string Instrument { get; } = "instrument";

    /// <summary>What kind of fault.</summary>
    public InstrumentFaultKind Kind { get; }
}
