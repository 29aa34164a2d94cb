using CsCheck;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class DacCodeSearchTests
{
    // Gain: 0.1 % per code around 2048; offset: 1 mV per code around 2048; target 0.5 V + 10 mV/°C (as in DacTrimTests).
    private static readonly DacTrimSpec Spec = new()
    {
        Gain = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "GAIN" },
        Offset = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "OFFS" },
        Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
    };

    [Fact]
    public void Choose_HandWorkedUnit_OffsetCentredOnThePointsBeatsTheRoundedPair()
    {
        // Hand-worked [derived]. Untrimmed output 0.46 V at 0 °C and 1.41 V at 100 °C, calibrated at g0 = o0 = 2048.
        // Rounded on its own: g = 2101 (r = 1.053), o = 2064 (16 mV): errors +0.038 and +0.073 °C, largest 0.073.
        // With g = 2101 the errors without offset are (1.053·0.46 − 0.5)/0.01 = −1.562 and (1.053·1.41 − 1.5)/0.01 = −1.527 °C;
        // their centre −1.5445 °C asks for 15.445 mV: o = 2063 (15 mV) gives −0.062 and −0.027, largest 0.062.
        // g = 2100 (r = 1.052): −1.608 and −1.668, centre −1.638 → o = 2064: −0.008 and −0.068, largest 0.068.
        // g = 2102 (r = 1.054): −1.516 and −1.386, spread 0.130, so no offset gets below 0.065. Further gain codes tilt more.
        var result = DacCodeSearch.Choose(Spec, 1.0, 0.0, [0.0, 100.0], [0.46, 1.41], 2101, 2064);

        Assert.Equal(2101, result.GainCode);
        Assert.Equal(2063, result.OffsetCode);
        Assert.Equal(0.062, result.MaxAbsErrorC, 9);
        Assert.Equal(0.073, result.RoundedMaxAbsErrorC, 9);
    }

    [Fact]
    public void Choose_OutputShift_IsTakenOutByTheOffset()
    {
        // A measured output 3 mV above the model (e.g. from a DAC check) needs 3 offset codes less [derived: O is additive].
        var plain = DacCodeSearch.Choose(Spec, 1.0, 0.0, [0.0, 100.0], [0.46, 1.41], 2101, 2064);
        var shifted = DacCodeSearch.Choose(Spec, 1.0, 0.0, [0.0, 100.0], [0.46, 1.41], 2101, 2064, outputShiftVolts: 0.003);

        Assert.Equal(plain.GainCode, shifted.GainCode);
        Assert.Equal(plain.OffsetCode - 3, shifted.OffsetCode);
        Assert.Equal(plain.MaxAbsErrorC, shifted.MaxAbsErrorC, 9);
    }

    [Fact]
    public void Choose_RandomCurvedUnits_NeverWorseThanRoundingAndBestOverEveryOffsetCode()
    {
        // The largest |d(T) + c| is convex in the offset c and smallest at the centre of d's range, so for each gain code
        // the best whole offset code is one of the two around that centre [derived]: checked against every offset code of
        // the DAC for each gain code of the window, on units with a parabolic bow of up to ±0.3 °C over −20…+40 °C.
        double[] temperatures = Enumerable.Range(0, 13).Select(i => -20.0 + (5.0 * i)).ToArray();
        Gen.Select(Gen.Double[0.0092, 0.0108], Gen.Double[0.4, 0.6], Gen.Double[-0.003, 0.003]).Sample((slope, offset, bow) =>
        {
            var outputs = temperatures.Select(t => offset + (slope * t) + (bow * (t - 10) * (t - 10) / 900)).ToArray();
            var gIdeal = 2048 + (((0.01 / slope) - 1) / 0.001);
            var g0 = (long)Math.Round(gIdeal, MidpointRounding.AwayFromZero);
            var r = 1 + (0.001 * (g0 - 2048));
            var o0 = (long)Math.Round(2048 + ((0.5 - (r * offset)) / 0.001), MidpointRounding.AwayFromZero);

            var result = DacCodeSearch.Choose(Spec, 1.0, 0.0, temperatures, outputs, g0, o0);

            Assert.True(result.MaxAbsErrorC <= result.RoundedMaxAbsErrorC + 1e-12);
            var brute = double.PositiveInfinity;
            for (var g = g0 - DacCodeSearch.GainCodeWindow; g <= g0 + DacCodeSearch.GainCodeWindow; g++)
            {
                var ratio = 1 + (0.001 * (g - 2048));
                for (long o = 0; o <= 4095; o++)
                {
                    var worst = 0.0;
                    for (var i = 0; i < temperatures.Length; i++)
                    {
                        worst = Math.Max(worst, Math.Abs(((ratio * outputs[i]) + (0.001 * (o - 2048)) - 0.5 - (0.01 * temperatures[i])) / 0.01));
                    }

                    brute = Math.Min(brute, worst);
                }
            }

            Assert.Equal(brute, result.MaxAbsErrorC, 9);
        }, iter: 40);
    }
}
