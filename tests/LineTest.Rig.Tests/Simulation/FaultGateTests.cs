using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class FaultGateTests
{
    [Fact]
    public void OnCommand_NothingArmed_ReturnsNull()
    {
        var gate = new FaultGate();

        Assert.Null(gate.OnCommand());
        Assert.True(gate.IsEmpty);
    }

    [Fact]
    public void OnCommand_ArmedAfterTwo_HoldsFromThirdCommandOn()
    {
        var gate = new FaultGate();
        var fault = RigFault.MeterGarbage(afterCommands: 2);
        gate.Arm(fault);

        Assert.Null(gate.OnCommand());
        Assert.Null(gate.OnCommand());
        Assert.Same(fault, gate.OnCommand());
        Assert.Same(fault, gate.OnCommand());
    }

    [Fact]
    public void OnCommand_TwoArmed_FirstArmedThatHoldsWins()
    {
        var gate = new FaultGate();
        var later = RigFault.MeterSilent(afterCommands: 1);
        var now = RigFault.MeterGarbage();
        gate.Arm(later);
        gate.Arm(now);

        Assert.Same(now, gate.OnCommand());
        Assert.Same(later, gate.OnCommand());
    }

    [Fact]
    public void Clear_Armed_NoFaultHolds()
    {
        var gate = new FaultGate();
        gate.Arm(RigFault.MeterSilent());

        gate.Clear();

        Assert.Null(gate.OnCommand());
    }
}
