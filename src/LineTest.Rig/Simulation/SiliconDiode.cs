namespace LineTest.Rig.Simulation;

/// <summary>
/// A silicon junction diode driven at constant forward current, by the Shockley equation with series resistance:
/// <c>V = n·V_T·ln(I/I_s(T) + 1) + I·R_s</c>, <c>V_T = kT/q</c>, and the usual temperature law of the saturation current
/// <c>I_s(T) = I_s(T0)·(T/T0)^XTI·exp(−(E_g/(n·V_T))·(1 − T/T0))</c>, i.e. I_s ∝ T^XTI·exp(−E_g/(n·k·T)). The
/// forward-voltage slope of about −2 mV/°C and its slight curvature are not put in: they follow from these equations.
/// </summary>
/// <param name="SaturationCurrentAtT0Amps">I_s at <see cref="ReferenceKelvin"/>, amperes.</param>
/// <param name="Ideality">Emission coefficient n (1 for an ideal junction).</param>
/// <param name="SeriesResistanceOhms">Bulk and contact series resistance R_s, Ω.</param>
public sealed record SiliconDiode(double SaturationCurrentAtT0Amps, double Ideality, double SeriesResistanceOhms)
{
    /// <summary>Boltzmann constant, J/K; exact in the SI since 2019.</summary>
    public const double BoltzmannJoulesPerKelvin = 1.380649e-23;

    /// <summary>Elementary charge, C; exact in the SI since 2019.</summary>
    public const double ElementaryChargeCoulombs = 1.602176634e-19;

    /// <summary>0 °C in kelvin, exact by definition of the Celsius scale.</summary>
    public const double ZeroCelsiusKelvin = 273.15;

    /// <summary>Reference temperature T0 of the saturation-current law, K (27 °C, the usual device-model nominal).</summary>
    public const double ReferenceKelvin = 300.15;

    /// <summary>Band gap of silicon used in the saturation-current law, eV (≈ 1.12 eV near room temperature).</summary>
    public const double SiliconBandGapElectronVolts = 1.12;

    /// <summary>Saturation-current temperature exponent XTI for a junction diode.</summary>
    public const double SaturationCurrentTemperatureExponent = 3.0;

    /// <summary>This part's saturation-current temperature exponent XTI (<see cref="SaturationCurrentTemperatureExponent"/> by default).</summary>
    public double Xti { get; init; } = SaturationCurrentTemperatureExponent;

    /// <summary>This part's band-gap energy in the saturation-current law, eV (<see cref="SiliconBandGapElectronVolts"/> by default).</summary>
    public double BandGapElectronVolts { get; init; } = SiliconBandGapElectronVolts;

    /// <summary>
    /// Resistance of a leakage path across the junction, Ω (a leaky junction: surface leakage or a damaged die), or null
    /// for none. Part of the current then bypasses the junction, which pulls the forward voltage down most at low current.
    /// </summary>
    public double? ShuntOhms { get; init; }

    /// <summary>Thermal voltage kT/q, volts, at <paramref name="kelvin"/>.</summary>
    public static double ThermalVolts(double kelvin) => BoltzmannJoulesPerKelvin * kelvin / ElementaryChargeCoulombs;

    /// <summary>The saturation current at <paramref name="kelvin"/>, amperes.</summary>
    public double SaturationCurrentAmps(double kelvin)
    {
        RequirePositiveKelvin(kelvin);
        var nVt = Ideality * ThermalVolts(kelvin);
        var ratio = kelvin / ReferenceKelvin;
        return SaturationCurrentAtT0Amps
            * Math.Pow(ratio, Xti)
            * Math.Exp(-(BandGapElectronVolts / nVt) * (1 - ratio));
    }

    /// <summary>Forward voltage at <paramref name="celsius"/> when driven with <paramref name="currentAmps"/>, volts.</summary>
    public double ForwardVolts(double celsius, double currentAmps)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(currentAmps);
        var kelvin = celsius + ZeroCelsiusKelvin;
        var nVt = Ideality * ThermalVolts(kelvin);
        var saturation = SaturationCurrentAmps(kelvin);
        var junction = nVt * Math.Log((currentAmps / saturation) + 1);
        if (ShuntOhms is { } shunt)
        {
            junction = LeakyJunctionVolts(currentAmps, saturation, nVt, shunt, junction);
        }

        return junction + (currentAmps * SeriesResistanceOhms);
    }

    /// <summary>
    /// The junction voltage V_j where I_s·(exp(V_j/(n·V_T)) − 1) + V_j/R_sh = I, by bisection between 0 and the voltage
    /// without the shunt (the left side rises monotonically in V_j, so the root is unique and inside that interval).
    /// </summary>
    private static double LeakyJunctionVolts(double amps, double saturation, double nVt, double shuntOhms, double withoutShunt)
    {
        double low = 0, high = withoutShunt;
        for (var i = 0; i < 80; i++)
        {
            var mid = 0.5 * (low + high);
            var current = (saturation * (Math.Exp(mid / nVt) - 1)) + (mid / shuntOhms);
            if (current > amps)
            {
                high = mid;
            }
            else
            {
                low = mid;
            }
        }

        return 0.5 * (low + high);
    }

    /// <summary>
    /// The diode with ideality <paramref name="ideality"/> and series resistance <paramref name="seriesResistanceOhms"/>
    /// whose forward voltage at <paramref name="celsius"/> and <paramref name="currentAmps"/> is <paramref name="forwardVolts"/>
    /// (solves the Shockley equation for I_s(T) and refers it to T0).
    /// </summary>
    public static SiliconDiode WithForwardVolts(double forwardVolts, double celsius, double currentAmps, double ideality, double seriesResistanceOhms)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(currentAmps);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(ideality);
        var junctionVolts = forwardVolts - (currentAmps * seriesResistanceOhms);
        if (junctionVolts <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(forwardVolts), forwardVolts, "The forward voltage must exceed the drop across the series resistance.");
        }

        var kelvin = celsius + ZeroCelsiusKelvin;
        var nVt = ideality * ThermalVolts(kelvin);
        var saturationAtT = currentAmps / (Math.Exp(junctionVolts / nVt) - 1);
        var unit = new SiliconDiode(1.0, ideality, seriesResistanceOhms);
        return unit with { SaturationCurrentAtT0Amps = saturationAtT / unit.SaturationCurrentAmps(kelvin) };
    }

    private static void RequirePositiveKelvin(double kelvin)
    {
        if (!(kelvin > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(kelvin), kelvin, "A diode temperature must be above absolute zero.");
        }
    }
}
