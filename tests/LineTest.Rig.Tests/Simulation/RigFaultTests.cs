using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class RigFaultTests
{
    [Fact]
    public void UnitSilent_Factory_CarriesSlotAndCount()
    {
        var fault = RigFault.UnitSilent(slot: 2, afterCommands: 5);

        Assert.Equal((RigFaultKind.UnitSilent, 2, 5), (fault.Kind, fault.Slot, fault.AfterCommands));
    }

    [Fact]
    public void MeterSilent_NegativeCount_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => RigFault.MeterSilent(afterCommands: -1));
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void ReferenceDrift_ZeroOrNotFinite_Throws(double rate)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => RigFault.ReferenceDrift(rate));
    }
}
