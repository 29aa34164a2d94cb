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
}
