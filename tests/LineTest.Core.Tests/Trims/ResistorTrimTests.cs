using CsCheck;
using LineTest.Core.Calibration;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ResistorTrimTests
{
    // Rf = 40 kΩ, Rg0 = 10 kΩ → G0 = 5; Vref = 2.5 V, Rfo = 10 kΩ, Ro0 = 100 kΩ → Voff0 = 0.25 V.
    private static readonly ResistorTrimSpec Spec = new()
    {
        Series = "E96",
        AllowPairs = false,
        TolerancePercent = 1,
        Gain = new ResistorGainNetwork { Position = "R7", FeedbackOhms = 40_000, FittedOhms = 10_000, MinOhms = 1_000, MaxOhms = 100_000 },
        Offset = new ResistorOffsetNetwork
        {
            Position = "R8", ReferenceVolts = 2.5, FeedbackOhms = 10_000, FittedOhms = 100_000, MinOhms = 10_000, MaxOhms = 1_000_000,
        },
        Target = new LinearTransfer { OffsetVolts = 0.5, SlopeVoltsPerC = 0.01 },
    };

    // The unit u(T) = 0.05 + 0.0019·T V: V = 5·u + 0.25 = 0.5 + 0.0095·T.
    private static readonly CalibrationPoint[] LowSlopePoints = [new("cold", 0, 0.5), new("hot", 100, 1.45)];

    [Fact]
    public void Compute_LowSlopeUnitE96_MatchesHandWorkedValues()
    {
        // Hand-worked. a = 0.5, b = 0.0095. G* = 5·0.01/0.0095 = 5.263158; Rg* = 40 000/4.263158 = 9382.716 Ω
        // → E96 9.31 kΩ (ln 0.0078 vs 0.0156 for 9.53 kΩ). G = 1 + 40 000/9310 = 5.296455, r = G/5 = 1.059291.
        // Voff* = 0.5 − 1.059291·(0.5 − 0.25) = 0.235177 V; Ro* = 2.5·10 000/0.235177 = 106 302.8 Ω → 107 kΩ,
        // Voff = 25 000/107 000 = 0.233645 V.
        // Error(T) = (1.059291·(0.25 + 0.0095·T) + 0.233645 − 0.5 − 0.01·T)/0.01 → −0.15324 at 0 °C,
        // 0.47942 at 100 °C, 0.16309 at 50 °C.
        // Worst case (each part ±1 %, four corners): 0.59726, 1.75699, 1.02837 °C.
        var result = ResistorTrim.Compute(Spec, LowSlopePoints, [new TrimCheckpoint("verify", 50)]).Value;

        Assert.Equal(5.263157895, result.IdealGain, 7);
        Assert.Equal(9382.716049, result.Gain.IdealOhms, 5);
        Assert.Equal([9310.0], result.Gain.Parts);
        Assert.Equal(0.235177229, result.IdealOffsetVolts, 7);
        Assert.Equal(106302.80886, result.Offset.IdealOhms, 4);
        Assert.Equal([107000.0], result.Offset.Parts);
        Assert.True(result.InRange);
        Assert.Equal(-0.153236897, result.PredictedErrors[0].ErrorC, 7);
        Assert.Equal(0.479416164, result.PredictedErrors[1].ErrorC, 7);
        Assert.Equal(0.163089633, result.PredictedErrors[2].ErrorC, 7);
        Assert.Equal(0.597264255, result.PredictedErrors[0].WorstCaseErrorC!.Value, 7);
        Assert.Equal(1.756986024, result.PredictedErrors[1].WorstCaseErrorC!.Value, 7);
        Assert.Equal(1.028373367, result.PredictedErrors[2].WorstCaseErrorC!.Value, 7);
        Assert.Equal(["Fit 9.31 kΩ (E96) in position R7", "Fit 107 kΩ (E96) in position R8"], result.Instructions);
    }

    [Fact]
    public void Compute_WithE24Pairs_UsesTheParallelPairAndShrinksTheError()
    {
        var spec = Spec with { Series = "E24", AllowPairs = true, TolerancePercent = 0.1 };

        var result = ResistorTrim.Compute(spec, LowSlopePoints).Value;

        // Same Rg* = 9382.716 Ω as above → 43 kΩ ∥ 12 kΩ (see ResistorSelectorTests).
        Assert.Equal(ResistorConnection.Parallel, result.Gain.Connection);
        Assert.Equal("Fit 43 kΩ and 12 kΩ (E24) in parallel in position R7", result.Instructions[0]);
        Assert.All(result.PredictedErrors, e => Assert.InRange(Math.Abs(e.ErrorC), 0, 0.05));
    }

    [Fact]
    public void Compute_IdealOutsideRange_SaysWhichPositionValueAndRange()
    {
        // Hand-worked: b = 0.0025 → G* = 5·0.01/0.0025 = 20, Rg* = 40 000/19 = 2105 Ω; with min 5 kΩ it is out of range.
        var spec = Spec with { Gain = Spec.Gain with { MinOhms = 5_000 } };
        CalibrationPoint[] points = [new("cold", 0, 0.5), new("hot", 100, 0.75)];

        var result = ResistorTrim.Compute(spec, points).Value;

        Assert.False(result.InRange);
        Assert.Contains("R7 of 2.105 kΩ needed, range 5 kΩ…100 kΩ", result.Problems);
        Assert.Empty(result.Instructions);
    }

    [Fact]
    public void Compute_GainBelowOne_Fails()
    {
        // Hand-worked: b = 0.06 → G* = 5·0.01/0.06 = 0.83 < 1: a non-inverting stage cannot attenuate.
        CalibrationPoint[] points = [new("cold", 0, 0.5), new("hot", 100, 6.5)];

        var result = ResistorTrim.Compute(Spec, points);

        Assert.False(result.Succeeded);
        Assert.Contains("cannot go below 1", result.Reason);
    }

    [Fact]
    public void Compute_OffsetOfWrongSign_FailsNamingThePosition()
    {
        // Hand-worked: a = 2.0, b = 0.01 → r = 1 (Rg* = 10 kΩ exactly, E96), Voff* = 0.5 − (2.0 − 0.25) = −1.25 V,
        // but Vref = +2.5 V can only add positive offsets.
        CalibrationPoint[] points = [new("cold", 0, 2.0), new("hot", 100, 3.0)];

        var result = ResistorTrim.Compute(Spec, points);

        Assert.False(result.Succeeded);
        Assert.Contains("R8", result.Reason);
        Assert.Contains("sign of Vref", result.Reason);
    }

    [Fact]
    public void Compute_ReversedSensor_Fails()
    {
        CalibrationPoint[] points = [new("cold", 0, 1.0), new("hot", 100, 0.5)];

        Assert.Equal(DacTrim.WrongSlopeReason, ResistorTrim.Compute(Spec, points).Reason);
    }

    [Fact]
    public void Compute_UnknownSeries_FailsNamingTheField()
    {
        var result = ResistorTrim.Compute(Spec with { Series = "E7" }, LowSlopePoints);

        Assert.False(result.Succeeded);
        Assert.Contains("series: 'E7'", result.Reason);
    }

    [Fact]
    public void ToRecord_CarriesValuesPartsAndWorstCase()
    {
        var spec = Spec with { Series = "E24", AllowPairs = true };
        var record = ResistorTrim.Compute(spec, LowSlopePoints, [new TrimCheckpoint("verify", 50)]).Value.ToRecord();

        Assert.Equal("resistor", record.Method);
        Assert.Equal(9381.818181818, record.Values["R7"], 6);
        Assert.Equal(43000, record.Values["R7.1"]);
        Assert.Equal(12000, record.Values["R7.2"]);
        Assert.True(record.PredictedErrorC.ContainsKey("verify"));
        Assert.True(record.PredictedErrorC["verify.worstCase"] >= Math.Abs(record.PredictedErrorC["verify"]));
        Assert.Equal(2, record.Instructions.Count);
    }

    [Fact]
    public void Compute_RandomUnits_ModelBuiltWithChosenPartsLandsWithinPrediction()
    {
        // Model (ResistorTrimSpec): V = (1 + Rf/Rg)·(u0 + u1·T) + Vref·Rfo/Ro.
        var units =
            from u0 in Gen.Double[-0.02, 0.02]
            from u1 in Gen.Double[1.6e-3, 2.4e-3]
            from third in Gen.Double[-40, 100]
            from pairs in Gen.Bool
            from series in Gen.Int[0, 2].Select(i => new[] { "E24", "E48", "E96" }[i])
            from gainCorner in Gen.Double[-1, 1].Array[2]
            from offsetCorner in Gen.Double[-1, 1].Array[2]
            select (u0, u1, third, pairs, series, gainCorner, offsetCorner);

        units.Sample(unit =>
        {
            var spec = Spec with { Series = unit.series, AllowPairs = unit.pairs };
            double Output(double rg, double ro, double t) =>
                (spec.Gain.GainWith(rg) * (unit.u0 + (unit.u1 * t))) + spec.Offset.OffsetVoltsWith(ro);
            double ErrorC(double rg, double ro, double t) =>
                (Output(rg, ro, t) - spec.Target.VoltsAt(t)) / spec.Target.SlopeVoltsPerC;

            CalibrationPoint[] points =
            [
                new("cold", -20, Output(10_000, 100_000, -20)),
                new("hot", 80, Output(10_000, 100_000, 80)),
            ];
            var result = ResistorTrim.Compute(spec, points, [new TrimCheckpoint("third", unit.third)]).Value;
            Assert.True(result.InRange, string.Join("; ", result.Problems));
            var predicted = result.PredictedErrors[2];

            // Nominal parts: exactly the predicted error.
            Assert.Equal(predicted.ErrorC, ErrorC(result.Gain.EffectiveOhms, result.Offset.EffectiveOhms, unit.third), 1e-9);

            // Parts anywhere within tolerance: within the predicted worst case.
            var t = spec.TolerancePercent / 100;
            var rg = Actual(result.Gain, unit.gainCorner, t);
            var ro = Actual(result.Offset, unit.offsetCorner, t);
            Assert.InRange(Math.Abs(ErrorC(rg, ro, unit.third)), 0, predicted.WorstCaseErrorC!.Value + 1e-9);
        }, iter: 150);

        static double Actual(ResistorChoice choice, double[] position, double tolerance) =>
            ResistorChoice.Combine(choice.Connection, choice.Parts.Select((p, i) => p * (1 + (position[i] * tolerance))).ToArray());
    }
}
