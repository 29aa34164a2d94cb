using LineTest.Core.Calibration;
using LineTest.Core.Characterisation;
using LineTest.Core.Decisions;

namespace LineTest.Core.Tests.Decisions;

public sealed class RatedRangeBudgetTests
{
    // A straight unit y = 0.5 V + 0.01 V/°C·T calibrated at −20 and +40 °C; the trim indicates (y − 0.5)/0.01 + bias.
    private static readonly List<CalibrationPoint> Points = [new("low", -20, 0.3), new("high", 40, 0.9)];

    // Reference u = 0.010 °C (certificate: ν infinite); mean output u = 0.1 mV (Type A of 10 samples: ν = 9) = 0.010 °C.
    private static readonly PointUncertainty[] Us = [new(0.010, null, 0.0001, 9), new(0.010, null, 0.0001, 9)];

    private static SensorCurve Straight() => SensorCurve.Fit(Points, null).TryGetValue(out var c) ? c : throw new InvalidOperationException();

    [Fact]
    public void Predict_HandWorkedTwoPointLine_FollowsLawOfPropagationAndWelchSatterthwaite()
    {
        // Hand-worked by JCGM 100:2008 §5.1.2 eq. (10), u_c² = Σ cᵢ²u²(xᵢ), and G.4.1 (Welch–Satterthwaite) [derived]:
        // the line's value at T is w₁·(point 1) + w₂·(point 2) with w₁ = (40 − T)/60, w₂ = (T + 20)/60.
        //  T = +10 °C: w = (½, ½); four contributions of 0.005 °C: u_c = 0.0100 °C; ν_eff = 0.01⁴/(2·0.005⁴/9) = 72.
        //  T = +40 °C: w = (0, 1); u_c = √(0.01² + 0.01²) = 0.01414 °C; ν_eff = (2·10⁻⁴)²/(0.01⁴/9) = 36.
        //  T = +70 °C: w = (−½, 3/2); u_c = √(2.5·2·10⁻⁴) = 0.02236 °C; ν_eff = (5·10⁻⁴)²/((0.5⁴ + 1.5⁴)·0.01⁴/9) = 43.9.
        var prediction = RatedRangeBudget.Predict(Straight(), y => ((y - 0.5) / 0.01) + 0.003, Us, -20, 70, gridPoints: 10);

        var at10 = prediction.Nearest(10);
        var at40 = prediction.Nearest(40);
        var at70 = prediction.Nearest(70);
        Assert.Equal(0.0100, at10.StandardUncertaintyC, 6);
        Assert.Equal(72.0, at10.EffectiveDegreesOfFreedom!.Value, 6);
        Assert.Equal(Math.Sqrt(2e-4), at40.StandardUncertaintyC, 9);
        Assert.Equal(36.0, at40.EffectiveDegreesOfFreedom!.Value, 6);
        Assert.Equal(Math.Sqrt(5e-4), at70.StandardUncertaintyC, 9);
        Assert.Equal(25e-8 / ((Math.Pow(0.5, 4) + Math.Pow(1.5, 4)) * 1e-8 / 9), at70.EffectiveDegreesOfFreedom!.Value, 6);
        Assert.All(prediction.Grid, p => Assert.Equal(0.003, p.ErrorC, 9));
        Assert.Equal(0.003, prediction.MaxAbsErrorC, 9);
        Assert.Equal(0.003, prediction.RmsErrorC, 9);
    }

    [Fact]
    public void WorstUncertainty_SmallEffectiveDegreesOfFreedom_UsesStudentT()
    {
        // ν_eff = 36 at +40 °C: k = t₉₅.₄₅(36) ≈ 2.06 (JCGM 100:2008 table G.2 lies between 2.05 at ν = 50 and 2.09 at ν = 25 [published]).
        var prediction = RatedRangeBudget.Predict(Straight(), y => ((y - 0.5) / 0.01) + ((y - 0.3) * 0.01), Us, -20, 40, gridPoints: 7);

        Assert.Equal(40.0, prediction.Worst.Celsius, 9);
        Assert.InRange(prediction.WorstUncertainty.CoverageFactor, 2.05, 2.09);
        Assert.Equal(prediction.WorstUncertainty.CoverageFactor * Math.Sqrt(2e-4), prediction.WorstUncertainty.Expanded, 9);
    }

    [Fact]
    public void FloorRmsC_WithResolution_AddsItInQuadrature()
    {
        var resolution = 0.01 / Math.Sqrt(12);

        var prediction = RatedRangeBudget.Predict(Straight(), y => (y - 0.5) / 0.01, Us, -20, 40, resolutionC: _ => resolution);

        var expected = Math.Sqrt(prediction.Grid.Average(p => (p.StandardUncertaintyC * p.StandardUncertaintyC) + (resolution * resolution)));
        Assert.Equal(expected, prediction.FloorRmsC, 12);
        Assert.True(prediction.FloorRmsC > prediction.RmsUncertaintyC);
    }

    [Fact]
    public void Predict_ModelSpread_XtiScalesTheBowAndBandGapLeavesNothing()
    {
        var model = new DiodeSensorModel { Xti = 3, XtiStdDev = 0.3, Ideality = 1.05, BandGapEvStdDev = 0.05 };
        double Volts(double c) => 3.75 - (5 * model.TypicalForwardVolts(c, 1.05));
        var points = new List<CalibrationPoint> { new("low", -20, Volts(-20)), new("high", 40, Volts(40)) };
        Assert.True(SensorCurve.Fit(points, model).TryGetValue(out var curve));
        PointUncertainty[] none = [new(0, null, 0, null), new(0, null, 0, null)];

        var prediction = RatedRangeBudget.Predict(curve, c => c, none, -20, 40, gridPoints: 61);

        // A 10 % spread of XTI is 10 % of the bow, which at +10 °C is (y(10) − chord)/slope [derived].
        var mid = prediction.Nearest(10).Budget!;
        var bowC = (curve.OutputAt(10) - ((curve.OutputAt(-20) + curve.OutputAt(40)) / 2)) / curve.Slope;
        Assert.Equal(Math.Abs(0.1 * bowC), mid.Components.Single(c => c.Name == "sensor model XTI").Contribution, 9);
        Assert.Equal(0.0, mid.Components.Single(c => c.Name == "sensor model band gap").Contribution, 9);
        Assert.Equal(0.0, prediction.Nearest(-20).StandardUncertaintyC, 9);
    }

    [Fact]
    public void Predict_PointCountDiffersFromCurve_Throws()
    {
        Assert.Throws<ArgumentException>(() => RatedRangeBudget.Predict(Straight(), c => c, [Us[0]], -20, 40));
    }

    [Fact]
    public void Predict_HandWorkedThreePointsWithTheUnitsCurvature_FollowsLawOfPropagation()
    {
        // Three points at −20, +5 and +40 °C, each with reference u = 0.010 °C (ν infinite) and mean output u = 0.1 mV
        // (ν = 9; slope ≈ 10 mV/°C, so 0.010 °C). Fitting a, b and the unit's curvature λ through three points, the weights
        // are 1 at their own point and 0 at the others, so at +5 °C the budget is that point's alone [JCGM 100:2008 §5.1.2,
        // eq. (10); G.4.1]: u_c = √(0.01² + 0.01²) = 0.01414 °C and ν_eff = (2·10⁻⁴)²/(0.01⁴/9) = 36. Between the points the
        // weights are nearly those of the parabola through them, since c(T) ∝ T·ln(T/T1) is within a few per cent of a
        // parabola over 60 K: at +10 °C Lagrange's are −0.1, 1.028571, 0.071429 [derived], so u_c ≈ 0.01414·√1.0681 =
        // 0.01462 °C. XTI's and n's spread scale the curved term, which λ takes up: they leave nothing.
        var model = new DiodeSensorModel { Xti = 3, XtiStdDev = 0.3, Ideality = 1.05, IdealityStdDev = 0.05 };
        double Volts(double c) => 3.75 - (5 * model.TypicalForwardVolts(c, 1.05));
        var points = new List<CalibrationPoint> { new("low", -20, Volts(-20)), new("mid", 5, Volts(5)), new("high", 40, Volts(40)) };
        Assert.True(SensorCurve.FitWithCurvature(points, model).TryGetValue(out var curve));
        PointUncertainty[] us = [.. Enumerable.Repeat(new PointUncertainty(0.010, null, 0.0001 * curve.Slope / 0.01, 9), 3)];

        var prediction = RatedRangeBudget.Predict(curve, c => c, us, -20, 40, gridPoints: 61);

        var at5 = prediction.Nearest(5);
        Assert.Equal(Math.Sqrt(2e-4), at5.StandardUncertaintyC, 9);
        Assert.Equal(36.0, at5.EffectiveDegreesOfFreedom!.Value, 6);
        Assert.Equal(Math.Sqrt(2e-4) * Math.Sqrt((0.1 * 0.1) + (1.028571 * 1.028571) + (0.071429 * 0.071429)), prediction.Nearest(10).StandardUncertaintyC, 3);
        Assert.All(prediction.Grid, p => Assert.Equal(0.0, p.Budget!.Components.Single(c => c.Name == "sensor model XTI").Contribution, 9));
        Assert.All(prediction.Grid, p => Assert.Equal(0.0, p.Budget!.Components.Single(c => c.Name == "sensor model ideality").Contribution, 9));
    }
}
