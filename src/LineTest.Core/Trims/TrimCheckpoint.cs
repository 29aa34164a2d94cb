namespace LineTest.Core.Trims;

/// <summary>
/// A temperature, beyond the calibration setpoints, at which a trim must predict its remaining error
/// (typically the verify setpoint).
/// </summary>
/// <param name="Name">Setpoint name, used as the key of the prediction.</param>
/// <param name="TemperatureC">Temperature, °C.</param>
public sealed record TrimCheckpoint(string Name, double TemperatureC);
