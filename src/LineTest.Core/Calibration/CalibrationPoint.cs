namespace LineTest.Core.Calibration;

/// <summary>
/// One calibration point of a unit: the reference temperature at a setpoint and the unit's output there
/// (volts for analog units, raw counts for digital ones).
/// </summary>
/// <param name="Setpoint">Setpoint name from the sequence, e.g. <c>cold</c>.</param>
/// <param name="ReferenceC">Reference thermometer temperature, °C.</param>
/// <param name="Output">The unit's output at that temperature (volts or counts).</param>
public sealed record CalibrationPoint(string Setpoint, double ReferenceC, double Output)
{
    /// <summary>
    /// Relative weight of the point in a weighted least-squares fit; 1 by default. Use 1/u² when
    /// the points have different standard uncertainties u.
    /// </summary>
    public double Weight { get; init; } = 1.0;
}
