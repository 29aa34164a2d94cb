namespace LineTest.Core.Decisions;

/// <summary>
/// The standard uncertainties of one calibration point, as its measure step recorded them: the reference temperature
/// (certificate, readout resolution, repeatability) and the unit's mean output (repeatability after averaging, meter
/// specification and resolution), each with its effective degrees of freedom (null: infinite).
/// </summary>
/// <param name="ReferenceC">u of the reference temperature, °C.</param>
/// <param name="ReferenceDegreesOfFreedom">ν of <paramref name="ReferenceC"/>.</param>
/// <param name="Output">u of the unit's mean output, in the output's unit (volts or counts).</param>
/// <param name="OutputDegreesOfFreedom">ν of <paramref name="Output"/>.</param>
public sealed record PointUncertainty(double ReferenceC, double? ReferenceDegreesOfFreedom, double Output, double? OutputDegreesOfFreedom);
