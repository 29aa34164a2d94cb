using System.Globalization;
using LineTest.Core.Characterisation;

namespace LineTest.Core.Calibration;

/// <summary>
/// What a sequence states about its product's sensing diode, for calibrations that follow the diode's curvature and
/// for the error budget over the rated range: the parameters of <see cref="DiodeTemperatureModel"/> with their
/// unit-to-unit spread (1σ), and the spread of a small quadratic non-linearity of the stage that reads the diode.
/// </summary>
/// <remarks>
/// JSON (on the trim): <c>"sensorModel": { "xti": 3, "xtiStdDev": 0.15, "ideality": 1.05, "idealityStdDev": 0.025,
/// "bandGapEv": 1.12, "bandGapEvStdDev": 0.005, "forwardVolts": 0.6, "forwardAtC": 25, "nonLinearityPerVoltStdDev": 0.004, "thermalTimeConstantSeconds": 40 }</c>.
/// The non-linearity is modelled as <c>v → v + β·(v − v_c)²</c> on the diode voltage with β of mean 0; only its spread
/// matters, because a trim cannot know a part's β.
/// </remarks>
public sealed record DiodeSensorModel
{
    /// <summary>Saturation-current temperature exponent XTI; 3 by default (junction diode).</summary>
    public double Xti { get; init; } = 3.0;

    /// <summary>Unit-to-unit spread of XTI (1σ); 0 by default.</summary>
    public double XtiStdDev { get; init; }

    /// <summary>Typical emission coefficient n; 1 by default. An I–V sweep of the unit replaces it where the sequence has one.</summary>
    public double Ideality { get; init; } = 1.0;

    /// <summary>Unit-to-unit spread of n (1σ), used when the unit has no I–V sweep; 0 by default.</summary>
    public double IdealityStdDev { get; init; }

    /// <summary>EG, eV; 1.12 by default (silicon).</summary>
    public double BandGapEv { get; init; } = 1.12;

    /// <summary>Unit-to-unit spread of EG (1σ), eV. It shifts only the straight part of V_f(T): two points remove it.</summary>
    public double BandGapEvStdDev { get; init; }

    /// <summary>Typical forward voltage at <see cref="ForwardAtC"/>, volts (sets the typical slope).</summary>
    public double ForwardVolts { get; init; } = 0.6;

    /// <summary>Temperature of <see cref="ForwardVolts"/>, °C.</summary>
    public double ForwardAtC { get; init; } = 25.0;

    /// <summary>Spread (1σ) of the quadratic non-linearity β of the stage that reads the diode, 1/V; 0 by default.</summary>
    public double NonLinearityPerVoltStdDev { get; init; }

    /// <summary>
    /// Time constant with which the unit follows its well, seconds, or null when not stated. With the soak's drift limit
    /// r it bounds what the unit still lags the well when the soak ends, |ΔT| ≤ r·τ (a first-order lag), which enters
    /// the error budget as a rectangular component at each calibration point.
    /// </summary>
    public double? ThermalTimeConstantSeconds { get; init; }

    /// <summary>Typical dV_f/dT at <paramref name="celsius"/>, volts per kelvin, with ideality <paramref name="ideality"/>.</summary>
    public double TypicalSlopeVoltsPerKelvin(double celsius, double ideality) => DiodeTemperatureModel.SlopeVoltsPerKelvin(
        celsius + ThermalVoltage.ZeroCelsiusKelvin, ForwardAtC + ThermalVoltage.ZeroCelsiusKelvin, ForwardVolts, BandGapEv, Xti, ideality);

    /// <summary>Typical V_f at <paramref name="celsius"/>, volts, with ideality <paramref name="ideality"/>.</summary>
    public double TypicalForwardVolts(double celsius, double ideality) => DiodeTemperatureModel.ForwardVolts(
        celsius + ThermalVoltage.ZeroCelsiusKelvin, ForwardAtC + ThermalVoltage.ZeroCelsiusKelvin, ForwardVolts, BandGapEv, Xti, ideality);

    /// <summary>Problems that make the model unusable, each with its JSON field name (camelCase).</summary>
    public IReadOnlyList<(string Field, string Reason)> Check()
    {
        var problems = new List<(string, string)>();
        void Positive(double value, string name)
        {
            if (!(value > 0) || !double.IsFinite(value))
            {
                problems.Add((name, string.Create(CultureInfo.InvariantCulture, $"{value} must be a positive number")));
            }
        }

        void NotNegative(double value, string name)
        {
            if (!(value >= 0) || !double.IsFinite(value))
            {
                problems.Add((name, string.Create(CultureInfo.InvariantCulture, $"{value} must be zero or a positive number")));
            }
        }

        Positive(Xti, "xti");
        Positive(Ideality, "ideality");
        Positive(BandGapEv, "bandGapEv");
        Positive(ForwardVolts, "forwardVolts");
        NotNegative(XtiStdDev, "xtiStdDev");
        NotNegative(IdealityStdDev, "idealityStdDev");
        NotNegative(BandGapEvStdDev, "bandGapEvStdDev");
        NotNegative(NonLinearityPerVoltStdDev, "nonLinearityPerVoltStdDev");
        if (ThermalTimeConstantSeconds is { } tau)
        {
            NotNegative(tau, "thermalTimeConstantSeconds");
        }
        if (!double.IsFinite(ForwardAtC) || ForwardAtC <= -ThermalVoltage.ZeroCelsiusKelvin)
        {
            problems.Add(("forwardAtC", string.Create(CultureInfo.InvariantCulture, $"{ForwardAtC} is not a temperature above absolute zero")));
        }

        if (problems.Count == 0 && !(ForwardVolts < BandGapEv))
        {
            problems.Add(("forwardVolts", "a forward voltage at or above the band gap gives no falling V_f(T)"));
        }

        return problems;
    }
}
