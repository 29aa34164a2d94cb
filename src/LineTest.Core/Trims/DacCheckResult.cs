namespace LineTest.Core.Trims;

/// <summary>What the differential check of a written DAC trim found (<see cref="DacCheck"/>).</summary>
/// <param name="ResidualVolts">Measured minus predicted change of the output from the calibration codes to the new ones, volts.</param>
/// <param name="ResidualC">The same in °C of the target transfer.</param>
/// <param name="GainCode">The gain code to store.</param>
/// <param name="OffsetCode">The offset code to store.</param>
/// <param name="Applied">False when the residual was too large for a DAC step error and the codes were left as computed.</param>
public sealed record DacCheckResult(double ResidualVolts, double ResidualC, long GainCode, long OffsetCode, bool Applied);
