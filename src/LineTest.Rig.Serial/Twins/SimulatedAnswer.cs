using LineTest.Rig.Instruments;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// Calls a simulated instrument on a twin's server thread and turns its answer, or its injected fault, into what a
/// real instrument would do on the wire: answer; stay silent; send junk; drop its port; report an error.
/// </summary>
internal static class SimulatedAnswer
{
    /// <summary>Bytes no instrument sends: DEL, NUL, a high byte and XOFF, then a line end.</summary>
    public static readonly byte[] Junk = [0x7F, 0x00, 0xE5, 0x13, (byte)'\n'];

    public static TwinReply From<T>(Func<Task<T>> call, Func<T, string> format, Func<string, string> error, TwinReply? garbage = null)
    {
        Task<T> task;
        try
        {
            task = call();
        }
        catch (InstrumentFaultException fault)
        {
            return ForFault(fault, error, garbage);
        }

        // Simulated instruments answer at once (they compute from the virtual clock and never wait on it).
        if (!task.IsCompleted)
        {
            throw new InvalidOperationException("A simulated instrument did not answer at once; a twin must never wait.");
        }

        if (task.IsFaulted && task.Exception?.InnerException is InstrumentFaultException f)
        {
            return ForFault(f, error, garbage);
        }

        return TwinReply.Answer(format(task.GetAwaiter().GetResult()));
    }

    public static TwinReply ForFault(InstrumentFaultException fault, Func<string, string> error, TwinReply? garbage) => fault.Kind switch
    {
        InstrumentFaultKind.NoAnswer => TwinReply.Silence,
        InstrumentFaultKind.GarbageReply => garbage ?? TwinReply.Raw(Junk),
        InstrumentFaultKind.PortLost => TwinReply.Unplug,
        _ => TwinReply.Answer(error(WithoutInstrument(fault))),
    };

    /// <summary>The fault's message without the leading "instrument: ".</summary>
    public static string WithoutInstrument(InstrumentFaultException fault)
        => fault.Message.StartsWith(fault.Instrument + ": ", StringComparison.Ordinal) ? fault.Message[(fault.Instrument.Length + 2)..] : fault.Message;
}
