using LineTest.Rig.Instruments;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class SimulatedCallTests
{
    [Fact]
    public async Task Run_CancelledToken_CancelledTaskAndCommandNotRun()
    {
        var ran = false;

        var task = SimulatedCall.Run(() => ran = true, new CancellationToken(canceled: true));

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => task);
        Assert.False(ran);
    }

    [Fact]
    public async Task Run_InstrumentFault_FaultedTaskNotSynchronousThrow()
    {
        var task = SimulatedCall.Run<double>(() => throw new InstrumentFaultException("meter", InstrumentFaultKind.NoAnswer, "x"), CancellationToken.None);

        Assert.True(task.IsFaulted);
        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => task);
        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
    }

    [Theory]
    [InlineData(RigFaultKind.UnitSilent, InstrumentFaultKind.NoAnswer)]
    [InlineData(RigFaultKind.UnitGarbage, InstrumentFaultKind.GarbageReply)]
    [InlineData(RigFaultKind.MeterPortLost, InstrumentFaultKind.PortLost)]
    public void FaultFor_Kind_MapsToInstrumentFaultKind(RigFaultKind kind, InstrumentFaultKind expected)
    {
        var fault = kind switch
        {
            RigFaultKind.UnitSilent => RigFault.UnitSilent(1),
            RigFaultKind.UnitGarbage => RigFault.UnitGarbage(1),
            _ => RigFault.MeterPortLost(),
        };

        var exception = SimulatedCall.FaultFor(fault, "unit slot 1");

        Assert.Equal(expected, exception.Kind);
        Assert.Equal("unit slot 1", exception.Instrument);
    }
}
