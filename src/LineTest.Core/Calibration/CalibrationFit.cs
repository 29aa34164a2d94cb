namespace LineTest.Core.Calibration;

/// <summary>
/// Fits of a unit's calibration points: output against reference temperature (analog units, DAC and
/// resistor trims) or temperature against raw output (digital units, firmware coefficients).
/// </summary>
public static class CalibrationFit
{
    /// <summary>
    /// Fits the unit's output y against the reference temperature x: y = c0 + c1·T (+ c2·T²),
    /// weighted by <see cref="CalibrationPoint.Weight"/>.
    /// </summary>
    public static CalculationResult<PolynomialFit> OutputVersusTemperature(
        IReadOnlyList<CalibrationPoint> points, FitOrder order = FitOrder.Linear)
    {
        ArgumentNullException.ThrowIfNull(points);
        return LeastSquares.Fit(
            points.Select(p => p.ReferenceC).ToArray(),
            points.Select(p => p.Output).ToArray(),
            order,
            Weights(points),
            points.Select(p => p.Setpoint).ToArray(),
            "reference temperature");
    }

    /// <summary>
    /// Fits temperature against the unit's raw output: T = c0 + c1·r (+ c2·r²), the form a digital
    /// unit's firmware evaluates, weighted by <see cref="CalibrationPoint.Weight"/>.
    /// </summary>
    public static CalculationResult<PolynomialFit> TemperatureVersusOutput(
        IReadOnlyList<CalibrationPoint> points, FitOrder order = FitOrder.Linear)
    {
        ArgumentNullException.ThrowIfNull(points);
        return LeastSquares.Fit(
            points.Select(p => p.Output).ToArray(),
            points.Select(p => p.ReferenceC).ToArray(),
            order,
            Weights(points),
            points.Select(p => p.Setpoint).ToArray(),
            "unit output");
    }

    private static double[]? Weights(IReadOnlyList<CalibrationPoint> points) =>
        points.All(p => p.Weight == 1.0) ? null : points.Select(p => p.Weight).ToArray();
}
