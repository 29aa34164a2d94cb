namespace LineTest.Core.Trims;

/// <summary>The error a trimmed unit is predicted to show at one temperature.</summary>
/// <param name="Name">Setpoint name.</param>
/// <param name="TemperatureC">Temperature, °C.</param>
/// <param name="ErrorC">Indicated minus true temperature with the chosen trim, °C.</param>
public sealed record PredictedError(string Name, double TemperatureC, double ErrorC)
{
    /// <summary>
    /// Largest |error| over the tolerance of the fitted parts (resistor trims), °C; null where the trim
    /// has no part tolerance (codes and coefficients are exact).
    /// </summary>
    public double? WorstCaseErrorC { get; init; }

    /// <summary>True when this temperature is one of the calibration setpoints (false for extra checkpoints).</summary>
    public bool AtCalibrationPoint { get; init; }
}
