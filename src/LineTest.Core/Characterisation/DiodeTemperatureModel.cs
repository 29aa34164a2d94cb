namespace LineTest.Core.Characterisation;

/// <summary>
/// Forward voltage of a junction diode at constant current as a function of temperature, in the closed form that
/// follows from the Shockley equation with the saturation-current law <c>I_s(T) ∝ T^XTI·exp(−EG/(n·k·T))</c>:
/// <c>V_f(T) = (T/T1)·V_f(T1) + EG·(1 − T/T1) − XTI·(n·k·T/q)·ln(T/T1)</c> (T in kelvin, EG in eV read as volts).
/// </summary>
/// <remarks>
/// <para>Derivation: V_f = n·V_T·ln(I/I_s(T)) with V_T = k·T/q. Writing I_s(T) = I_s(T1)·(T/T1)^XTI·exp(−(EG/(n·k))·(1/T − 1/T1))
/// and multiplying out gives the form above exactly (the "−1" of the Shockley equation and the drop across a series
/// resistance are left out; a constant I·R_s adds a constant, which a calibration absorbs).</para>
/// <para>The SPICE diode model writes the exponent of T as XTI/N; that is the same law with XTI_SPICE = n·XTI.</para>
/// <para>Only the last term is curved: the first two are a straight line in T. So two calibration points fix V_f(T1)
/// and EG, and the shape of the curve between and beyond them depends on XTI·n alone.</para>
/// </remarks>
public static class DiodeTemperatureModel
{
    /// <summary>k/q, volts per kelvin (SI 2019 exact constants).</summary>
    public const double BoltzmannOverCharge = ThermalVoltage.BoltzmannJoulesPerKelvin / ThermalVoltage.ElementaryChargeCoulombs;

    /// <summary>V_f at <paramref name="kelvin"/> from V_f at <paramref name="referenceKelvin"/> (T1), volts.</summary>
    /// <param name="kelvin">Junction temperature T, K.</param>
    /// <param name="referenceKelvin">Temperature T1 where the forward voltage is known, K.</param>
    /// <param name="forwardVoltsAtReference">V_f(T1), volts.</param>
    /// <param name="bandGapElectronVolts">EG, eV (1.12 for silicon near room temperature).</param>
    /// <param name="xti">Saturation-current temperature exponent XTI (3 for a junction diode).</param>
    /// <param name="ideality">Emission coefficient n.</param>
    public static double ForwardVolts(double kelvin, double referenceKelvin, double forwardVoltsAtReference, double bandGapElectronVolts, double xti, double ideality)
    {
        RequireKelvin(kelvin, nameof(kelvin));
        RequireKelvin(referenceKelvin, nameof(referenceKelvin));
        var ratio = kelvin / referenceKelvin;
        return (ratio * forwardVoltsAtReference) + (bandGapElectronVolts * (1 - ratio)) + CurvatureVolts(kelvin, referenceKelvin, xti, ideality);
    }

    /// <summary>The curved term alone, <c>−XTI·(n·k·T/q)·ln(T/T1)</c>, volts.</summary>
    public static double CurvatureVolts(double kelvin, double referenceKelvin, double xti, double ideality)
    {
        RequireKelvin(kelvin, nameof(kelvin));
        RequireKelvin(referenceKelvin, nameof(referenceKelvin));
        return -xti * ideality * BoltzmannOverCharge * kelvin * Math.Log(kelvin / referenceKelvin);
    }

    /// <summary>dV_f/dT at <paramref name="kelvin"/>, volts per kelvin: (V_f(T1) − EG)/T1 − XTI·n·(k/q)·(1 + ln(T/T1)).</summary>
    public static double SlopeVoltsPerKelvin(double kelvin, double referenceKelvin, double forwardVoltsAtReference, double bandGapElectronVolts, double xti, double ideality)
    {
        RequireKelvin(kelvin, nameof(kelvin));
        RequireKelvin(referenceKelvin, nameof(referenceKelvin));
        return ((forwardVoltsAtReference - bandGapElectronVolts) / referenceKelvin)
            - (xti * ideality * BoltzmannOverCharge * (1 + Math.Log(kelvin / referenceKelvin)));
    }

    private static void RequireKelvin(double kelvin, string name)
    {
        if (!(kelvin > 0) || !double.IsFinite(kelvin))
        {
            throw new ArgumentOutOfRangeException(name, kelvin, "A junction temperature must be a finite number of kelvin above absolute zero.");
        }
    }
}
