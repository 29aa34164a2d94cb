using LineTest.Core.Calibration;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class DacCheckTests
{
    // Gain: 0.1 % per code around 2048; offset: 1 mV per code around 2048; target 0.5 V + 10 mV/°C (as in DacTrimTests).
    private static readonly DacTrimSpec Spec = new()
    {
        Gain = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "GAIN" },
        Offset = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "OFFS" },
        Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
    };

    // Hand-worked [derived, as in DacTrimTests]: points (0 °C, 0.16 V), (100 °C, 1.11 V), so a = 0.16 V, b = 0.0095 V/°C;
    // g = 2101 (r = 1.053); O(o) = 0.5 − 1.053·0.16 = 0.33152 V → o* = 2379.52 → 2380, O = 0.332 V.
    private static DacTrimResult Trim() =>
        DacTrim.Compute(Spec, [new CalibrationPoint("cold", 0, 0.16), new CalibrationPoint("hot", 100, 1.11)], 2048, 2048).Value;

    [Fact]
    public void Evaluate_OffsetDacStepsHalfAPercentLong_TakesTheResidualOut()
    {
        // The real offset DAC steps 1.005 mV: with the new codes the unit at 0 °C gives 1.053·0.16 + 1.005·0.332 =
        // 0.16848 + 0.33366 = 0.50214 V where the model says 0.50048 V: residual 1.66 mV (0.166 °C) → 2 codes less [derived].
        var trim = Trim();
        Assert.Equal((2101, 2380), (trim.GainCode, trim.OffsetCode));

        var check = DacCheck.Evaluate(trim, 0.16, (1.053 * 0.16) + (1.005 * 0.332));

        Assert.Equal(0.00166, check.ResidualVolts, 12);
        Assert.Equal(0.166, check.ResidualC, 9);
        Assert.True(check.Applied);
        Assert.Equal(2101, check.GainCode);
        Assert.Equal(2378, check.OffsetCode);
    }

    [Fact]
    public void Evaluate_DacsThatDidNotMove_LeavesTheCodesForVerify()
    {
        // A stuck DAC: the output with the new codes is the old one, 0.34 V from the model's prediction, far beyond 2 % of
        // the two DACs' moves (0.332 + 0.053·0.16 = 0.3405 V → 6.8 mV) plus two offset steps.
        var trim = Trim();

        var check = DacCheck.Evaluate(trim, 0.16, 0.16);

        Assert.False(check.Applied);
        Assert.Equal((trim.GainCode, trim.OffsetCode), (check.GainCode, check.OffsetCode));
        Assert.Equal(0.16 - 0.50048, check.ResidualVolts, 12);
    }

    [Fact]
    public void Evaluate_WithACodeSearch_HandsItTheResidual()
    {
        var trim = Trim();
        var seen = double.NaN;

        var check = DacCheck.Evaluate(trim, 0.16, 0.50048 + 0.0004, shift =>
        {
            seen = shift;
            return (2100, 2381);
        });

        Assert.Equal(0.0004, seen, 12);
        Assert.True(check.Applied);
        Assert.Equal((2100, 2381), (check.GainCode, check.OffsetCode));
    }

    [Fact]
    public void Evaluate_AdjustmentBeyondTheDacRange_LeavesTheCodes()
    {
        var trim = Trim() with { OffsetCode = 4095, OffsetVolts = DacTrim.OffsetVolts(Spec.Offset, 4095) };
        var predicted = (1.053 * 0.16) + trim.OffsetVolts;

        var check = DacCheck.Evaluate(trim, 0.16, predicted - 0.003);

        Assert.False(check.Applied);
        Assert.Equal(4095, check.OffsetCode);
    }
}
