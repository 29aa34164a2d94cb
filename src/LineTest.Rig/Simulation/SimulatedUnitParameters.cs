namespace LineTest.Rig.Simulation;

/// <summary>The actual component values of one simulated part, drawn around its design values.</summary>
/// <param name="Diode">The sensing diode (its I_s, n and R_s).</param>
/// <param name="DesignGain">Actual amplifier gain at the nominal gain code.</param>
/// <param name="InputOffsetVolts">Amplifier input offset e_in, volts.</param>
/// <param name="GainStepPerCode">Actual fractional gain change per gain code.</param>
/// <param name="OffsetStepVolts">Actual output change per offset code, volts.</param>
/// <param name="LagTimeConstantSeconds">Time constant with which the sensor follows its well, seconds.</param>
/// <param name="SupplyCurrentAmps">Supply current, amperes.</param>
/// <param name="OpenRailVolts">Where the output rails if the sensor is open, volts.</param>
/// <param name="AdcReferenceVolts">Actual ADC reference of a digital unit, volts (unused by analog designs).</param>
public sealed record SimulatedUnitParameters(
    SiliconDiode Diode,
    double DesignGain,
    double InputOffsetVolts,
    double GainStepPerCode,
    double OffsetStepVolts,
    double LagTimeConstantSeconds,
    double SupplyCurrentAmps,
    double OpenRailVolts,
    double AdcReferenceVolts)
{
    /// <summary>
    /// Quadratic non-linearity β of the stage that reads the diode (amplifier input or ADC buffer), 1/V: it sees
    /// <c>v + β·(v − v_c)²</c> for a diode voltage v (<see cref="SimulatedUnitDesign.NonLinearityCentreVolts"/> is v_c).
    /// </summary>
    public double NonLinearityPerVolt { get; init; }

    /// <summary>
    /// Time constant with which the sensing die follows the probe body, seconds (0: the die is the body). The body follows
    /// the well with <see cref="LagTimeConstantSeconds"/>, so the die lags the well through two lags in series.
    /// </summary>
    public double TipLagTimeConstantSeconds { get; init; }
}
