using CsCheck;
using LineTest.Core.Calibration;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class DacTrimTests
{
    // Gain: 0.1 % per code around 2048; offset: 1 mV per code around 2048; target 0.5 V + 10 mV/°C.
    private static readonly DacTrimSpec Spec = new()
    {
        Gain = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "GAIN" },
        Offset = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 0.001, Register = "OFFS" },
        Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
    };

    [Fact]
    public void Compute_LowSlopeUnit_MatchesHandWorkedCodesAndErrors()
    {
        // Hand-worked. Points (0 °C, 0.46 V), (100 °C, 1.41 V) → a = 0.46 V, b = 0.0095 V/°C; g0 = o0 = 2048
        // so G(g0)/G_design = 1 and O(o0) = 0.
        // g* = 2048 + ((1 + 0.001·0)·0.01/0.0095 − 1)/0.001 = 2048 + 52.6316 = 2100.6316 → 2101;
        // r = 1 + 0.001·53 = 1.053.
        // O(o) = 0.5 − 1.053·(0.46 − 0) = 0.5 − 0.48438 = 0.01562 V → o* = 2048 + 15.62 = 2063.62 → 2064, O = 0.016 V.
        // Trimmed V(T) = 1.053·(0.46 + 0.0095·T) + 0.016 = 0.50038 + 0.0100035·T.
        // Error = (0.00038 + 0.0000035·T)/0.01 = 0.038 + 0.00035·T °C → 0.038 at 0, 0.073 at 100, 0.0555 at 50.
        CalibrationPoint[] points = [new("cold", 0, 0.46), new("hot", 100, 1.41)];

        var result = DacTrim.Compute(Spec, points, 2048, 2048, [new TrimCheckpoint("verify", 50)]).Value;

        Assert.Equal(2100.631579, result.IdealGainCode, 6);
        Assert.Equal(2101, result.GainCode);
        Assert.Equal(1.053, result.GainRatio, 12);
        Assert.Equal(2063.62, result.IdealOffsetCode, 9);
        Assert.Equal(2064, result.OffsetCode);
        Assert.Equal(0.016, result.OffsetVolts, 12);
        Assert.True(result.InRange);
        Assert.Equal(0.038, result.PredictedErrors[0].ErrorC, 9);
        Assert.Equal(0.073, result.PredictedErrors[1].ErrorC, 9);
        Assert.Equal(0.0555, result.PredictedErrors[2].ErrorC, 9);
        Assert.True(result.PredictedErrors[0].AtCalibrationPoint);
        Assert.False(result.PredictedErrors[2].AtCalibrationPoint);
    }

    [Fact]
    public void Compute_WithObjectiveTemperatures_ChoosesTheCodesTogether()
    {
        // The hand-worked unit above, judged at its two points [derived, see DacCodeSearchTests]: 2101/2063 leaves −0.062
        // and −0.027 °C where the independently rounded 2101/2064 leaves +0.038 and +0.073 °C.
        CalibrationPoint[] points = [new("cold", 0, 0.46), new("hot", 100, 1.41)];

        var result = DacTrim.Compute(Spec, points, 2048, 2048, objectiveC: [0.0, 100.0]).Value;

        Assert.Equal(2101, result.GainCode);
        Assert.Equal(2063, result.OffsetCode);
        Assert.Equal(-0.062, result.PredictedErrors[0].ErrorC, 9);
        Assert.Equal(-0.027, result.PredictedErrors[1].ErrorC, 9);
    }

    [Fact]
    public void Compute_UnitAlreadyOnTarget_KeepsItsCodes()
    {
        // Hand-worked. Calibrated with g0 = 2000 (G/G_design = 1 − 0.048 = 0.952) and o0 = 2100 (O = 0.052 V).
        // Points (−20, 0.30), (80, 1.30): a = 0.5, b = 0.01 = S, so r must be 1:
        // g* = 2048 + (0.952·0.01/0.01 − 1)/0.001 = 2048 − 48 = 2000;
        // O(o) = 0.5 − 1·(0.5 − 0.052) = 0.052 → o* = 2048 + 52 = 2100. Predicted error 0.
        CalibrationPoint[] points = [new("cold", -20, 0.30), new("hot", 80, 1.30)];

        var result = DacTrim.Compute(Spec, points, 2000, 2100).Value;

        Assert.Equal(2000, result.GainCode);
        Assert.Equal(2100, result.OffsetCode);
        Assert.All(result.PredictedErrors, e => Assert.Equal(0.0, e.ErrorC, 9));
    }

    [Fact]
    public void Compute_GainOutOfRange_SaysWhichCodeAndTheRange()
    {
        // Hand-worked. b = (0.66 − 0.46)/100 = 0.002: g* = 2048 + (0.01/0.002 − 1)/0.001 = 2048 + 4000 = 6048 > 4095.
        // Offset with r = 5: 0.5 − 5·0.46 = −1.8 V → o* = 2048 − 1800 = 248, in range.
        CalibrationPoint[] points = [new("cold", 0, 0.46), new("hot", 100, 0.66)];

        var result = DacTrim.Compute(Spec, points, 2048, 2048).Value;

        Assert.False(result.InRange);
        Assert.Equal(["gain code 6048 needed, range 0…4095"], result.Problems);
        Assert.Equal(248, result.OffsetCode);
        Assert.False(result.ToRecord().InRange);
    }

    [Fact]
    public void Compute_OffsetOutOfRange_SaysWhichCodeAndTheRange()
    {
        // Hand-worked. a = 3.0 V, b = 0.01: r = 1 (g = 2048), O = 0.5 − 3.0 = −2.5 V → o* = 2048 − 2500 = −452 < 0.
        CalibrationPoint[] points = [new("cold", 0, 3.0), new("hot", 100, 4.0)];

        var result = DacTrim.Compute(Spec, points, 2048, 2048).Value;

        Assert.Equal(["offset code -452 needed, range 0…4095"], result.Problems);
    }

    [Theory]
    [InlineData(0.6, 0.4)]
    [InlineData(0.5, 0.5)]
    public void Compute_SlopeWrongSignOrZero_FailsAsOpenOrReversedSensor(double coldVolts, double hotVolts)
    {
        CalibrationPoint[] points = [new("cold", 0, coldVolts), new("hot", 100, hotVolts)];

        var result = DacTrim.Compute(Spec, points, 2048, 2048);

        Assert.False(result.Succeeded);
        Assert.Equal("sensor slope has the wrong sign — open or reversed sensor?", result.Reason);
    }

    [Fact]
    public void Compute_OnePoint_FailsWithTheFitReason()
    {
        var result = DacTrim.Compute(Spec, [new("cold", 0, 0.46)], 2048, 2048);

        Assert.False(result.Succeeded);
        Assert.Contains("at least 2 points", result.Reason);
    }

    [Fact]
    public void Compute_ZeroStepInSpec_FailsNamingTheField()
    {
        var spec = Spec with { Gain = Spec.Gain with { Step = 0 } };

        var result = DacTrim.Compute(spec, [new("cold", 0, 0.46), new("hot", 100, 1.41)], 2048, 2048);

        Assert.False(result.Succeeded);
        Assert.Contains("gain.step", result.Reason);
    }

    [Fact]
    public void ToRecord_CarriesCodesFitAndPredictions()
    {
        CalibrationPoint[] points = [new("cold", 0, 0.46), new("hot", 100, 1.41)];
        var record = DacTrim.Compute(Spec, points, 2048, 2048, [new TrimCheckpoint("verify", 50)]).Value.ToRecord();

        Assert.Equal("dac", record.Method);
        Assert.Equal(2101, record.Values["gainCode"]);
        Assert.Equal(2064, record.Values["offsetCode"]);
        Assert.Equal(0.0095, record.Inputs["fit.slopeVoltsPerC"], 12);
        Assert.Equal(0.0555, record.PredictedErrorC["verify"], 9);
        Assert.True(record.InRange);
    }

    [Fact]
    public void Compute_RandomLinearUnits_ErrorAtThirdTemperatureIsAsPredictedAndWithinRoundingBound()
    {
        // Model (the equation in DacTrimSpec): V = G_design·(1 + s_g·(g − N_g))·(u0 + u1·T) + s_o·(o − N_o).
        var spec = new DacTrimSpec
        {
            Gain = new DacChannelSpec { Min = 0, Max = 8191, Nominal = 4096, Step = 1e-4, Register = "GAIN" },
            Offset = new DacChannelSpec { Min = 0, Max = 4095, Nominal = 2048, Step = 2.5e-4, Register = "OFFS" },
            Target = new LinearTransfer { OffsetVolts = 0.1, SlopeVoltsPerC = 0.01 },
        };
        var units =
            from gainError in Gen.Double[-0.10, 0.10]
            from u0 in Gen.Double[-0.02, 0.02]
            from u1 in Gen.Double[1.6e-3, 2.4e-3]
            from g0 in Gen.Long[4046, 4146]
            from o0 in Gen.Long[1998, 2098]
            from cold in Gen.Double[-30, 0]
            from hot in Gen.Double[40, 85]
            from third in Gen.Double[-40, 100]
            select (GDesign: 5.0 * (1 + gainError), u0, u1, g0, o0, cold, hot, third);

        units.Sample(unit =>
        {
            double Output(long g, long o, double t) =>
                (unit.GDesign * DacTrim.GainFactor(spec.Gain, g) * (unit.u0 + (unit.u1 * t))) + DacTrim.OffsetVolts(spec.Offset, o);

            CalibrationPoint[] points =
            [
                new("cold", unit.cold, Output(unit.g0, unit.o0, unit.cold)),
                new("hot", unit.hot, Output(unit.g0, unit.o0, unit.hot)),
            ];
            var result = DacTrim.Compute(spec, points, unit.g0, unit.o0, [new TrimCheckpoint("third", unit.third)]).Value;
            Assert.True(result.InRange, string.Join("; ", result.Problems));

            var actualErrorC = (Output(result.GainCode, result.OffsetCode, unit.third) - spec.Target.VoltsAt(unit.third))
                / spec.Target.SlopeVoltsPerC;
            Assert.Equal(result.PredictedErrors[2].ErrorC, actualErrorC, 1e-9);

            // Rounding bound: the gain code is at most ½ code from ideal, a relative slope error of
            // (s_g/2)/(1 + s_g·(g* − N_g)); the offset is matched at 0 °C up to ½ code, s_o/2 volts.
            var idealFactor = 1 + (spec.Gain.Step * (result.IdealGainCode - spec.Gain.Nominal));
            var bound = (spec.Gain.Step / 2 / idealFactor * Math.Abs(unit.third))
                + (spec.Offset.Step / 2 / spec.Target.SlopeVoltsPerC) + 1e-9;
            Assert.InRange(Math.Abs(actualErrorC), 0, bound);
        }, iter: 500);
    }
}
