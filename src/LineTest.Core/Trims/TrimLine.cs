namespace LineTest.Core.Trims;

/// <summary>
/// The straight line of a unit's untrimmed output that a gain-and-offset trim maps onto the target (output =
/// Intercept + Slope·T), and the unit's modelled output at any temperature, for predictions between and beyond the
/// calibration points. A <c>minimax</c> fit gives the best line over the rated range instead of the line through the points.
/// </summary>
/// <param name="Intercept">Output at 0 °C of the line.</param>
/// <param name="Slope">Output per °C of the line.</param>
/// <param name="OutputAt">The modelled untrimmed output at a temperature, °C.</param>
public sealed record TrimLine(double Intercept, double Slope, Func<double, double> OutputAt);
