using LineTest.Rig.Instruments;

namespace LineTest.Rig.Simulation;

/// <summary>
/// Turns a simulated instrument's synchronous answer into the task the instrument interfaces expect.
/// Simulated instruments never wait on a timer (the virtual clock is driven by the coordinator's single flow);
/// a fault becomes a faulted task, just as a real driver's would, and cancellation a cancelled task.
/// </summary>
internal static class SimulatedCall
{
    public static Task<T> Run<T>(Func<T> command, CancellationToken cancellationToken)
    {
        if (cancellationToken.IsCancellationRequested)
        {
            return Task.FromCanceled<T>(cancellationToken);
        }

        try
        {
            return Task.FromResult(command());
        }
        catch (InstrumentFaultException fault)
        {
            return Task.FromException<T>(fault);
        }
    }

    public static Task Run(Action command, CancellationToken cancellationToken)
        => Run(
            () =>
            {
                command();
                return true;
            },
            cancellationToken);

    /// <summary>The exception a command-counted fault produces on an instrument.</summary>
    public static InstrumentFaultException FaultFor(RigFault fault, string instrument) => fault.Kind switch
    {
        RigFaultKind.MeterSilent or RigFaultKind.SourceSilent or RigFaultKind.ReferenceSilent or RigFaultKind.UnitSilent or RigFaultKind.SourceMeterSilent
            => new InstrumentFaultException(instrument, InstrumentFaultKind.NoAnswer, "no answer within the timeout (simulated fault)"),
        RigFaultKind.MeterGarbage or RigFaultKind.UnitGarbage
            => new InstrumentFaultException(instrument, InstrumentFaultKind.GarbageReply, "reply could not be understood (simulated fault)"),
        RigFaultKind.MeterPortLost
            => new InstrumentFaultException(instrument, InstrumentFaultKind.PortLost, "port disappeared (simulated fault)"),
        _ => new InstrumentFaultException(instrument, InstrumentFaultKind.Other, $"simulated fault {fault.Kind}"),
    };
}
