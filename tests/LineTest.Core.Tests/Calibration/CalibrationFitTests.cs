using LineTest.Core.Calibration;

namespace LineTest.Core.Tests.Calibration;

public sealed class CalibrationFitTests
{
    [Fact]
    public void OutputVersusTemperature_TwoSetpoints_GivesOffsetAndSlope()
    {
        // Hand-worked: 0.46 V at 0 °C and 1.41 V at 100 °C → b = 0.95/100 = 0.0095 V/°C, a = 0.46 V.
        CalibrationPoint[] points = [new("cold", 0, 0.46), new("hot", 100, 1.41)];

        var fit = CalibrationFit.OutputVersusTemperature(points).Value;

        Assert.Equal(0.46, fit.Intercept, 12);
        Assert.Equal(0.0095, fit.Slope, 12);
    }

    [Fact]
    public void TemperatureVersusOutput_TwoSetpoints_InvertsTheAxes()
    {
        // Hand-worked: 10 000 counts at −20 °C, 30 000 counts at 80 °C → T = −70 + 0.005·r.
        CalibrationPoint[] points = [new("cold", -20, 10_000), new("hot", 80, 30_000)];

        var fit = CalibrationFit.TemperatureVersusOutput(points).Value;

        Assert.Equal(-70.0, fit.Intercept, 9);
        Assert.Equal(0.005, fit.Slope, 15);
    }

    [Fact]
    public void OutputVersusTemperature_UsesPointWeights()
    {
        // With one point weighted 10⁶ times more, the line must pass (almost) through it.
        CalibrationPoint[] points =
        [
            new("a", 0, 0.50) { Weight = 1e6 },
            new("b", 50, 1.00),
            new("c", 100, 1.52),
        ];

        var fit = CalibrationFit.OutputVersusTemperature(points).Value;

        Assert.Equal(0.50, fit.Evaluate(0), 5);
    }

    [Fact]
    public void OutputVersusTemperature_SameReference_FailsNamingTheQuantity()
    {
        CalibrationPoint[] points = [new("a", 25, 0.7), new("b", 25, 0.8)];

        var result = CalibrationFit.OutputVersusTemperature(points);

        Assert.False(result.Succeeded);
        Assert.Contains("same reference temperature", result.Reason);
    }

    [Fact]
    public void TemperatureVersusOutput_InfiniteOutput_FailsNamingTheSetpoint()
    {
        CalibrationPoint[] points = [new("cold", -20, double.PositiveInfinity), new("hot", 80, 30_000)];

        var result = CalibrationFit.TemperatureVersusOutput(points);

        Assert.False(result.Succeeded);
        Assert.Contains("'cold'", result.Reason);
        Assert.Contains("unit output", result.Reason);
    }
}
