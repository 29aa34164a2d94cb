using CsCheck;
using LineTest.Core.Calibration;
using LineTest.Core.Characterisation;

namespace LineTest.Core.Tests.Calibration;

public sealed class SensorCurveTests
{
    private static readonly DiodeSensorModel Model = new() { Xti = 3, Ideality = 1.05, BandGapEv = 1.12, ForwardVolts = 0.6, ForwardAtC = 25 };

    /// <summary>An analog unit: y = 0.75·5 − 5·V_f(T) with this model's diode, V_f(25 °C) = <paramref name="vf25"/>.</summary>
    private static double AnalogVolts(double celsius, double vf25 = 0.6, double xti = 3) =>
        (5 * 0.75) - (5 * DiodeTemperatureModel.ForwardVolts(celsius + 273.15, 298.15, vf25, 1.12, xti, 1.05));

    private static List<CalibrationPoint> Points(Func<double, double> output, params double[] celsius) =>
        celsius.Select(c => new CalibrationPoint($"p{c}", c, output(c))).ToList();

    [Fact]
    public void OutputAt_TwoPointsOfAModelledUnit_FollowsItsCurveOverTheRange()
    {
        Assert.True(SensorCurve.Fit(Points(c => AnalogVolts(c, 0.61), -20, 40), Model).TryGetValue(out var curve));

        foreach (var c in new[] { -30.0, -10, 5, 25, 60 })
        {
            // κ comes from the model's typical slope (V_f 0.600 V); this part has 0.610 V, so its slope is about 1.7 % less
            // steep and κ about 1.7 % off: of the 2.5 mV bow that is about 0.04 mV, 0.06 mV extrapolated to +60 °C [derived].
            Assert.InRange(Math.Abs(AnalogVolts(c, 0.61) - curve.OutputAt(c)), 0, 8e-5);
        }

        Assert.InRange(curve.OutputPerDiodeVolt, -5.1, -4.9);
        Assert.All(curve.Residuals, r => Assert.Equal(0.0, r, 12));
    }

    [Fact]
    public void Fit_WithoutModel_IsTheLineThroughThePoints()
    {
        Assert.True(SensorCurve.Fit(Points(c => AnalogVolts(c), -20, 40), null).TryGetValue(out var curve));

        var chordAt5 = AnalogVolts(-20) + ((AnalogVolts(40) - AnalogVolts(-20)) * 25 / 60);
        Assert.Equal(chordAt5, curve.OutputAt(5), 12);
        Assert.Equal(0.0, curve.OutputPerDiodeVolt);
    }

    [Fact]
    public void Fit_ThirdPointOffTheModel_KeepsItsResidual()
    {
        var points = Points(c => AnalogVolts(c), -20, 5, 40);
        points[1] = points[1] with { Output = points[1].Output + 0.003 };

        Assert.True(SensorCurve.Fit(points, Model).TryGetValue(out var curve));

        // Least squares with the curvature fixed: residuals sum to zero and the middle one carries most of the 3 mV.
        Assert.Equal(0.0, curve.Residuals.Sum(), 9);
        Assert.InRange(curve.Residuals[1], 0.0015, 0.0025);
    }

    [Fact]
    public void ShapeErrorC_StraightDelta_LeavesNothing()
    {
        Assert.True(SensorCurve.Fit(Points(c => AnalogVolts(c), -20, 40), Model).TryGetValue(out var curve));

        Assert.Equal(0.0, curve.ShapeErrorC(t => 0.01 + (0.002 * t), 60), 12);
    }

    [Fact]
    public void MinimaxLine_ModelledUnit_HalvesTheLargestErrorOfTheLineThroughThePoints()
    {
        // For a parabola-like bow the line through the ends of the range leaves its whole sag mid-range; the minimax line
        // shares it equally above and below: half the largest error [derived from the equioscillation property].
        Assert.True(SensorCurve.Fit(Points(c => AnalogVolts(c), -20, 40), Model).TryGetValue(out var curve));
        var grid = Enumerable.Range(0, 61).Select(i => -20.0 + i).ToArray();
        var chord = grid.Max(t => Math.Abs(curve.OutputAt(t) - (curve.OutputAt(-20) + ((curve.OutputAt(40) - curve.OutputAt(-20)) * (t + 20) / 60))));

        var best = curve.MinimaxLine(-20, 40);

        Assert.InRange(best.MaxAbsError / chord, 0.49, 0.51);
        Assert.InRange(chord / Math.Abs(curve.Slope), 0.2, 0.27);
    }

    [Fact]
    public void FitWithCurvature_ThreePointsOfAUnitWithItsOwnXti_FollowsItsCurveExactly()
    {
        // A part with XTI = 3.3 against the model's 3: its curved term is 1.1 × the model's (the published form scales
        // with XTI), so y = a + b·T + (−5·1.1)·c(T) and the three-term fit through three points reproduces it everywhere.
        double Unit(double c) => AnalogVolts(c, 0.6, 3.3);

        Assert.True(SensorCurve.FitWithCurvature(Points(Unit, -20, 5, 40), Model).TryGetValue(out var curve));

        Assert.True(curve.CurvatureFitted);
        Assert.Equal(-5.5, curve.CurvatureScale * curve.OutputPerDiodeVolt, 9);
        foreach (var c in new[] { -30.0, -20, -3, 5, 17, 40, 60 })
        {
            Assert.Equal(Unit(c), curve.OutputAt(c), 11);
        }

        Assert.All(curve.Residuals, r => Assert.Equal(0.0, r, 11));
    }

    [Fact]
    public void FitWithCurvature_HandWorkedThreePoints_CurvatureIsTheMiddlePointsBowOverTheModels()
    {
        // Hand-worked [derived from the published form V_f(T) = (T/T1)·V_f(T1) + EG·(1 − T/T1) − XTI·(n·k·T/q)·ln(T/T1),
        // SI 2019 k and q]: with XTI = 3, n = 1.05, T1 = 298.15 K the curved term is c(−20 °C) = 11.24303 mV,
        // c(5 °C) = 5.24262 mV, c(40 °C) = −4.17244 mV; the chord of the outer two at 5 °C is
        // 11.24303 + (−4.17244 − 11.24303)·25/60 = 4.81991 mV, so the model's bow there is 0.42270 mV. With three points a
        // and b take up the straight part, so λ = (y(5) − chord_y(5)) / (κ·0.42270 mV). Here the middle output sits
        // 0.25 mV below the unit's chord: λ·κ·0.42270 mV = −0.25 mV.
        var points = Points(c => 0.3 + (0.01 * (c + 20)), -20, 5, 40);
        points[1] = points[1] with { Output = points[1].Output - 0.00025 };

        Assert.True(SensorCurve.FitWithCurvature(points, Model).TryGetValue(out var curve));

        Assert.Equal(-0.00025 / 0.00042270, curve.CurvatureScale * curve.OutputPerDiodeVolt, 3);
        // The stored evidence: the middle point against the model's nominal curve (λ = 1) through the outer points.
        Assert.Equal(0.0, curve.ResidualsFromNominalBow[0], 12);
        Assert.Equal(0.0, curve.ResidualsFromNominalBow[2], 12);
        Assert.Equal(-0.00025 - (curve.OutputPerDiodeVolt * 0.00042270), curve.ResidualsFromNominalBow[1], 7);
    }

    [Fact]
    public void Weights_CurvatureFitted_OneAtTheirOwnPointAndReproduceTheBasis()
    {
        Assert.True(SensorCurve.FitWithCurvature(Points(c => AnalogVolts(c, 0.6, 3.2), -20, 5, 40), Model).TryGetValue(out var curve));

        // Least-squares weights through three points are 1 at their own point, 0 at the others, and reproduce each basis
        // function: Σwᵢ = 1, Σwᵢ·Tᵢ = T, Σwᵢ·c(Tᵢ) = c(T) [least-squares projection property].
        double[] at = [-20, 5, 40];
        for (var j = 0; j < 3; j++)
        {
            var w = curve.Weights(at[j]);
            for (var i = 0; i < 3; i++)
            {
                Assert.Equal(i == j ? 1.0 : 0.0, w[i], 9);
            }
        }

        foreach (var t in new[] { -30.0, 10, 60 })
        {
            var w = curve.Weights(t);
            Assert.Equal(1.0, w.Sum(), 9);
            Assert.Equal(t, w.Select((wi, i) => wi * at[i]).Sum(), 8);
            Assert.Equal(curve.DiodeCurvatureVolts(t), w.Select((wi, i) => wi * curve.DiodeCurvatureVolts(at[i])).Sum(), 11);
        }
    }

    [Fact]
    public void ShapeErrorC_CurvatureFitted_AbsorbsAChangeOfXti()
    {
        Assert.True(SensorCurve.FitWithCurvature(Points(c => AnalogVolts(c), -20, 5, 40), Model).TryGetValue(out var curve));

        // A change of XTI or n scales the curved term, which λ takes up: nothing is left anywhere in the range.
        Assert.Equal(0.0, curve.ShapeErrorC(t => 0.1 * curve.OutputPerDiodeVolt * curve.DiodeCurvatureVolts(t), 30), 12);
        Assert.NotEqual(0.0, SensorCurve.Fit(Points(c => AnalogVolts(c), -20, 40), Model).Value.ShapeErrorC(
            t => 0.1 * curve.OutputPerDiodeVolt * curve.DiodeCurvatureVolts(t), 10), 6);
    }

    [Fact]
    public void FitWithCurvature_TwoDistinctTemperatures_SaysWhy()
    {
        var result = SensorCurve.FitWithCurvature(Points(c => AnalogVolts(c), -20, 40, 40), Model);

        Assert.False(result.Succeeded);
        Assert.Contains("three distinct temperatures", result.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void FitWithCurvature_RandomPoints_AgreesWithMathNetLinearCombination()
    {
        // MathNet.Numerics Fit.LinearCombination (least squares over the basis 1, T, c(T)) as an independent reference:
        // a, b and the curved term's coefficient λ·κ must agree, for 3 to 8 points with noise on the outputs.
        var model = Model;
        double C(double celsius) => DiodeTemperatureModel.CurvatureVolts(celsius + 273.15, 298.15, 3, 1.05);
        Gen.Int[-400, 1200].Select(i => i * 0.1 - 40).Array[3, 8]
            .Select(Gen.Double[-0.002, 0.002].Array[8], Gen.Double[2.6, 3.4], Gen.Double[0.58, 0.62])
            .Where(t => t.Item1.Distinct().Count() == t.Item1.Length && t.Item1.Max() - t.Item1.Min() > 20)
            .Sample((celsius, noise, xti, vf25) =>
            {
                var points = celsius.Select((c, i) => new CalibrationPoint($"p{i}", c, AnalogVolts(c, vf25, xti) + noise[i])).ToList();
                var reference = MathNet.Numerics.Fit.LinearCombination(celsius, points.Select(p => p.Output).ToArray(), _ => 1.0, t => t, C);

                var curve = SensorCurve.FitWithCurvature(points, model).Value;

                Assert.Equal(reference[0], curve.Intercept, 1e-7);
                Assert.Equal(reference[1], curve.Slope, 1e-9);
                Assert.Equal(reference[2], curve.CurvatureScale * curve.OutputPerDiodeVolt, 1e-5 * Math.Max(1, Math.Abs(reference[2])));
            }, iter: 200);
    }

    [Fact]
    public void FitWithCurvature_PointsThatCannotShowTheBow_SaysWhy()
    {
        // Two of three points a micro-kelvin apart: the three-term fit is singular for practical purposes.
        var result = SensorCurve.FitWithCurvature(Points(c => AnalogVolts(c), -20, -20.000001, 40), Model);

        Assert.False(result.Succeeded);
        Assert.Contains("do not show the diode's curvature", result.Reason, StringComparison.Ordinal);
    }
}
