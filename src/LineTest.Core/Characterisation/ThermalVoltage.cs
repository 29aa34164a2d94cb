namespace LineTest.Core.Characterisation;

/// <summary>
/// The thermal voltage V_T = k·T/q of a p-n junction, from the exact SI 2019 values of the Boltzmann constant and
/// the elementary charge (BIPM, The International System of Units, 9th edition, 2019, table 1).
/// </summary>
public static class ThermalVoltage
{
    /// <summary>Boltzmann constant k, J/K; exact in the SI since 2019.</summary>
    public const double BoltzmannJoulesPerKelvin = 1.380649e-23;

    /// <summary>Elementary charge e, C; exact in the SI since 2019.</summary>
    public const double ElementaryChargeCoulombs = 1.602176634e-19;

    /// <summary>0 °C in kelvin, exact by the definition of the Celsius scale.</summary>
    public const double ZeroCelsiusKelvin = 273.15;

    /// <summary>k·T/q, volts, at <paramref name="kelvin"/> (which must be above absolute zero).</summary>
    public static double AtKelvin(double kelvin)
    {
        if (!(kelvin > 0) || !double.IsFinite(kelvin))
        {
            throw new ArgumentOutOfRangeException(nameof(kelvin), kelvin, "A junction temperature must be a finite number of kelvin above absolute zero.");
        }

        return BoltzmannJoulesPerKelvin * kelvin / ElementaryChargeCoulombs;
    }

    /// <summary>k·T/q, volts, at <paramref name="celsius"/>.</summary>
    public static double AtCelsius(double celsius) => AtKelvin(celsius + ZeroCelsiusKelvin);
}
