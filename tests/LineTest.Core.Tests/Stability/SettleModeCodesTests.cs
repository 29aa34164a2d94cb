using LineTest.Core.Stability;

namespace LineTest.Core.Tests.Stability;

public sealed class SettleModeCodesTests
{
    [Fact]
    public void Names_AndWords_AreTheStoredContract()
    {
        Assert.Equal("settle.cal-low.mode", SettleModeCodes.ModeReading("cal-low"));
        Assert.Equal("settle.cal-low.residual", SettleModeCodes.ResidualReading("cal-low"));
        Assert.Equal("settle.cal-low.referenceResidual", SettleModeCodes.ReferenceResidualReading("cal-low"));
        Assert.Equal("predictive", SettleModeCodes.Word(SettleModeCodes.Predictive));
        Assert.Equal("window-fallback", SettleModeCodes.Word(SettleModeCodes.WindowFallback));
        Assert.Throws<ArgumentOutOfRangeException>(() => SettleModeCodes.Word(0));
    }
}
