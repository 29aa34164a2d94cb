using System.Globalization;
using LineTest.Core.Calibration;

namespace LineTest.Core.Characterisation;

/// <summary>
/// The forward-voltage temperature coefficient at a bias current from two fitted sweeps at two temperatures, and the
/// straight-line extrapolation of V_f to 0 K (the band-gap-related intercept used to characterise diode thermometers).
/// </summary>
public static class ForwardVoltageTemperature
{
    /// <summary>Smallest temperature difference between the sweeps for a slope worth reporting, °C.</summary>
    public const double MinimumSpanC = 5.0;

    /// <summary>
    /// Slope and 0 K intercept of V_f(<paramref name="biasAmps"/>) between <paramref name="first"/> (at
    /// <paramref name="firstCelsius"/>) and <paramref name="second"/> (at <paramref name="secondCelsius"/>).
    /// </summary>
    public static CalculationResult<ForwardVoltageTemperatureResult> Compute(
        ShockleyFitResult first, double firstCelsius, ShockleyFitResult second, double secondCelsius, double biasAmps)
    {
        ArgumentNullException.ThrowIfNull(first);
        ArgumentNullException.ThrowIfNull(second);
        if (!(biasAmps > 0) || !double.IsFinite(biasAmps))
        {
            return Fail($"the bias current must be a positive number of amperes, not {T(biasAmps)}");
        }

        if (!double.IsFinite(firstCelsius) || !double.IsFinite(secondCelsius))
        {
            return Fail("both sweep temperatures must be numbers");
        }

        var span = secondCelsius - firstCelsius;
        if (Math.Abs(span) < MinimumSpanC)
        {
            return Fail($"the two sweeps are only {T(Math.Abs(span))} °C apart; a temperature coefficient needs {T(MinimumSpanC)} °C or more");
        }

        var v1 = first.VoltsAt(biasAmps);
        var v2 = second.VoltsAt(biasAmps);
        var slope = (v2 - v1) / span;
        var zeroKelvin = v1 - (slope * (firstCelsius + ThermalVoltage.ZeroCelsiusKelvin));
        return CalculationResult<ForwardVoltageTemperatureResult>.Success(
            new ForwardVoltageTemperatureResult(biasAmps, firstCelsius, v1, secondCelsius, v2, slope, zeroKelvin));
    }

    private static CalculationResult<ForwardVoltageTemperatureResult> Fail(string reason) =>
        CalculationResult<ForwardVoltageTemperatureResult>.Failure(reason);

    private static string T(double value) => value.ToString("G4", CultureInfo.InvariantCulture);
}
