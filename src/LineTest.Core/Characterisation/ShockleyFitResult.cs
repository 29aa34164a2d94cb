namespace LineTest.Core.Characterisation;

/// <summary>
/// The junction parameters that best explain a forward I–V sweep by <c>V = n·V_T·ln(I/I_s + 1) + I·R_s</c>
/// (see <see cref="ShockleyFit"/>), with their standard errors and the residuals.
/// </summary>
public sealed record ShockleyFitResult
{
    /// <summary>Junction temperature the sweep was taken at, K.</summary>
    public required double Kelvin { get; init; }

    /// <summary>Thermal voltage k·T/q at <see cref="Kelvin"/>, volts.</summary>
    public required double ThermalVolts { get; init; }

    /// <summary>Natural logarithm of the saturation current in amperes (the fitted parameter).</summary>
    public required double LnSaturationCurrent { get; init; }

    /// <summary>Saturation current I_s at <see cref="Kelvin"/>, amperes.</summary>
    public double SaturationCurrentAmps => Math.Exp(LnSaturationCurrent);

    /// <summary>Decimal logarithm of I_s in amperes (the value limits are usually written in).</summary>
    public double Log10SaturationCurrent => LnSaturationCurrent / Math.Log(10);

    /// <summary>Ideality (emission) factor n.</summary>
    public required double Ideality { get; init; }

    /// <summary>Series resistance R_s, Ω.</summary>
    public required double SeriesResistanceOhms { get; init; }

    /// <summary>Standard error of ln I_s (equal to the relative standard error of I_s).</summary>
    public required double LnSaturationCurrentStandardError { get; init; }

    /// <summary>Standard error of log10 I_s.</summary>
    public double Log10SaturationCurrentStandardError => LnSaturationCurrentStandardError / Math.Log(10);

    /// <summary>Standard error of n.</summary>
    public required double IdealityStandardError { get; init; }

    /// <summary>Standard error of R_s, Ω.</summary>
    public required double SeriesResistanceStandardErrorOhms { get; init; }

    /// <summary>Measured minus fitted voltage at each point, in sweep order, volts.</summary>
    public required IReadOnlyList<double> ResidualsVolts { get; init; }

    /// <summary>Largest |residual|, volts.</summary>
    public double MaxAbsResidualVolts => ResidualsVolts.Count == 0 ? 0 : ResidualsVolts.Max(Math.Abs);

    /// <summary>Residual standard deviation s = √(Σr²/(N − 3)), volts.</summary>
    public required double ResidualStandardDeviationVolts { get; init; }

    /// <summary>Levenberg–Marquardt iterations taken (accepted and rejected steps).</summary>
    public required int Iterations { get; init; }

    /// <summary>Number of points fitted.</summary>
    public int Count => ResidualsVolts.Count;

    /// <summary>The fitted forward voltage at <paramref name="currentAmps"/>, volts.</summary>
    public double VoltsAt(double currentAmps)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(currentAmps);
        return ShockleyFit.Model(currentAmps, LnSaturationCurrent, Ideality, SeriesResistanceOhms, ThermalVolts);
    }
}
