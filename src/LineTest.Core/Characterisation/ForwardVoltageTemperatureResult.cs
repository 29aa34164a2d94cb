namespace LineTest.Core.Characterisation;

/// <summary>
/// How a junction's forward voltage at a fixed bias current changes between two sweeps at two temperatures.
/// </summary>
/// <param name="BiasAmps">The bias current the forward voltages are taken at (from each sweep's fitted curve), amperes.</param>
/// <param name="FirstCelsius">Temperature of the first sweep, °C.</param>
/// <param name="FirstVolts">Fitted forward voltage at <paramref name="BiasAmps"/> in the first sweep, volts.</param>
/// <param name="SecondCelsius">Temperature of the second sweep, °C.</param>
/// <param name="SecondVolts">Fitted forward voltage at <paramref name="BiasAmps"/> in the second sweep, volts.</param>
/// <param name="SlopeVoltsPerC">dV_f/dT, the chord slope between the two sweeps, volts per °C (negative for a diode).</param>
/// <param name="ZeroKelvinVolts">
/// V_f extrapolated along that chord to 0 K: V_f(T₁) − (dV_f/dT)·T₁[K]. For silicon this lands near the band-gap voltage
/// E_g(0)/q ≈ 1.2 V (plus a few tens of millivolts from the T³ law of I_s and the I·R_s drop), so a value far from it
/// marks a junction that is not the expected material.
/// </param>
public sealed record ForwardVoltageTemperatureResult(
    double BiasAmps,
    double FirstCelsius,
    double FirstVolts,
    double SecondCelsius,
    double SecondVolts,
    double SlopeVoltsPerC,
    double ZeroKelvinVolts);
