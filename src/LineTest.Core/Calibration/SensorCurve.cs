using System.Globalization;
using LineTest.Core.Characterisation;

namespace LineTest.Core.Calibration;

/// <summary>
/// A unit's output (volts or raw counts) as a function of temperature, through its calibration points, with the
/// sensing diode's curvature: <c>y(T) = a + b·T + κ·c(T)</c>, where c(T) is the curved term of
/// <see cref="DiodeTemperatureModel"/> (zero without a sensor model) and κ = dy/dV_f the output per diode volt.
/// </summary>
/// <remarks>
/// <para>Fitting the published form V_f(T) = (T/T1)·V_f(T1) + EG·(1 − T/T1) − XTI·(n·k·T/q)·ln(T/T1) to two points
/// solves for V_f(T1) and EG; since the first two terms are a straight line in T, that is the same as fitting a and b
/// with the curved term fixed, which is what is done here (least squares when there are more than two points, with the
/// residuals kept). The stage after the diode (amplifier, ADC) is taken as linear, so it only scales the curvature by
/// κ; κ is the fitted slope over the model's typical dV_f/dT at the middle of the calibration points (its error,
/// a few per cent of the bow, is second order).</para>
/// </remarks>
public sealed class SensorCurve
{
    private readonly double[] _pointsC;
    private readonly double _meanC;
    private readonly double _sxx;

    // With the curvature fitted: the three-term least squares (1, T, κ·c(T)) in a centred and scaled basis.
    private readonly CurvatureBasis? _basis;

    private SensorCurve(
        DiodeSensorModel? model, double ideality, double outputPerDiodeVolt, double intercept, double slope, double[] pointsC, double[] residuals,
        CurvatureBasis? basis = null, double curvatureScale = 1.0)
    {
        Model = model;
        Ideality = ideality;
        OutputPerDiodeVolt = outputPerDiodeVolt;
        Intercept = intercept;
        Slope = slope;
        _pointsC = pointsC;
        _meanC = pointsC.Average();
        _sxx = pointsC.Sum(t => (t - _meanC) * (t - _meanC));
        Residuals = residuals;
        _basis = basis;
        CurvatureScale = curvatureScale;
    }

    /// <summary>The sensor model, or null for a straight line.</summary>
    public DiodeSensorModel? Model { get; }

    /// <summary>The ideality n used for the curvature (the unit's own from an I–V sweep, or the model's typical).</summary>
    public double Ideality { get; }

    /// <summary>κ, the output per volt of diode forward voltage (negative for an inverting amplifier).</summary>
    public double OutputPerDiodeVolt { get; }

    /// <summary>a, output at 0 °C of the straight part.</summary>
    public double Intercept { get; }

    /// <summary>b, output per °C of the straight part.</summary>
    public double Slope { get; }

    /// <summary>
    /// λ, this unit's bow over the model's: 1 when the curvature is taken from the model, fitted to the points by
    /// <see cref="FitWithCurvature"/> (the unit's XTI·n over the model's, with the read-out non-linearity absorbed).
    /// </summary>
    public double CurvatureScale { get; }

    /// <summary>Whether <see cref="CurvatureScale"/> was fitted to this unit's points (<see cref="FitWithCurvature"/>).</summary>
    public bool CurvatureFitted => _basis is not null;

    /// <summary>
    /// With the curvature fitted: each point's measured output minus the model's nominal curve (λ = 1) through the two
    /// outer points, in the points' order (zero at the outer points; the bow this unit shows beyond the model's); empty
    /// otherwise.
    /// </summary>
    public IReadOnlyList<double> ResidualsFromNominalBow { get; private init; } = [];

    /// <summary>Measured minus modelled output at each calibration point, in the points' order (zero for two points).</summary>
    public IReadOnlyList<double> Residuals { get; }

    /// <summary>Temperatures of the calibration points, °C.</summary>
    public IReadOnlyList<double> PointsC => _pointsC;

    /// <summary>Fits the curve through <paramref name="points"/> (two or more distinct temperatures).</summary>
    /// <param name="points">Calibration points.</param>
    /// <param name="model">The sensor model; null fits a straight line.</param>
    /// <param name="ideality">The unit's ideality from an I–V sweep, or null for the model's typical value.</param>
    public static CalculationResult<SensorCurve> Fit(IReadOnlyList<CalibrationPoint> points, DiodeSensorModel? model, double? ideality = null)
    {
        ArgumentNullException.ThrowIfNull(points);
        var line = CalibrationFit.OutputVersusTemperature(points, FitOrder.Linear);
        if (!line.TryGetValue(out var straight))
        {
            return CalculationResult<SensorCurve>.Failure(line.Reason!);
        }

        var n = ideality ?? model?.Ideality ?? 1.0;
        var t = points.Select(p => p.ReferenceC).ToArray();
        var kappa = 0.0;
        if (model is not null)
        {
            var diodeSlope = model.TypicalSlopeVoltsPerKelvin(t.Average(), n);
            kappa = straight.Slope / diodeSlope;
        }

        var unfitted = new SensorCurve(model, n, kappa, 0, 0, t, []);
        var corrected = points.Select(p => p with { Output = p.Output - (kappa * unfitted.DiodeCurvatureVolts(p.ReferenceC)) }).ToList();
        var fit = CalibrationFit.OutputVersusTemperature(corrected, FitOrder.Linear);
        if (!fit.TryGetValue(out var lineFit))
        {
            return CalculationResult<SensorCurve>.Failure(fit.Reason!);
        }

        return CalculationResult<SensorCurve>.Success(new SensorCurve(model, n, kappa, lineFit.Intercept, lineFit.Slope, t, lineFit.Residuals.ToArray()));
    }

    /// <summary>
    /// Fits the curve with this unit's own curvature: y(T) = a + b·T + λ·κ·c(T), least squares in a, b and λ over three
    /// or more calibration points at distinct temperatures (through all three when there are three).
    /// </summary>
    /// <remarks>
    /// <para>Why one curvature parameter: in the published form only −XTI·(n·k·T/q)·ln(T/T1) is curved, and it scales
    /// with XTI·n; the stage after the diode adds β·(V_f − V_c)², whose curved part over a span of tens of kelvin is a
    /// parabola in T, as is T·ln T to within a few per cent of its bow (its second derivative is 1/T, which changes by
    /// 24 % from −20 to +40 °C). Two such shapes cannot be told apart by one further point, so a single scale λ of the
    /// model's curved term takes up all of them: λ − 1 is the unit's departure from the nominal bow.</para>
    /// <para>κ is the same as in <see cref="Fit"/> (the straight-line slope over the model's typical dV_f/dT). The
    /// normal equations are solved in a centred and scaled basis (1, (T − T̄)/s_T, (g − ḡ)/s_g), which leaves the fit
    /// unchanged and keeps the 3×3 system well conditioned.</para>
    /// </remarks>
    /// <param name="points">Three or more calibration points at distinct temperatures.</param>
    /// <param name="model">The sensor model that gives the shape of the curved term.</param>
    /// <param name="ideality">The unit's ideality from an I–V sweep, or null for the model's typical value.</param>
    public static CalculationResult<SensorCurve> FitWithCurvature(IReadOnlyList<CalibrationPoint> points, DiodeSensorModel model, double? ideality = null)
    {
        ArgumentNullException.ThrowIfNull(points);
        ArgumentNullException.ThrowIfNull(model);
        if (points.Select(p => p.ReferenceC).Distinct().Count() < 3)
        {
            return CalculationResult<SensorCurve>.Failure(
                $"fitting the unit's own curvature needs calibration points at three distinct temperatures or more, not {points.Select(p => p.ReferenceC).Distinct().Count()}");
        }

        var nominalFit = Fit(points, model, ideality);
        if (!nominalFit.TryGetValue(out var nominal))
        {
            return nominalFit;
        }

        var t = points.Select(p => p.ReferenceC).ToArray();
        var g = t.Select(c => nominal.OutputPerDiodeVolt * nominal.DiodeCurvatureVolts(c)).ToArray();
        var basis = CurvatureBasis.Create(t, g);
        if (basis is null)
        {
            return CalculationResult<SensorCurve>.Failure(
                "the calibration points do not show the diode's curvature (the points are too close together or the model has no bow): the unit's curvature cannot be fitted");
        }

        var y = points.Select(p => p.Output).ToArray();
        var (a, b, lambda) = basis.Coefficients(y);
        var residuals = y.Select((yi, i) => yi - (a + (b * t[i]) + (lambda * g[i]))).ToArray();

        // The evidence for λ: each point against the model's nominal curve through the two outer points.
        // The nominal curve through the outer points has the same κ: y_lo + (y_hi − y_lo)·f + κ·(c(T) − chord of c at T).
        var lo = Array.IndexOf(t, t.Min());
        var hi = Array.IndexOf(t, t.Max());
        double Chord(double atLo, double atHi, double celsius) => atLo + ((atHi - atLo) * (celsius - t[lo]) / (t[hi] - t[lo]));
        var bow = t.Select((c, i) => y[i] - Chord(y[lo], y[hi], c) - (g[i] - Chord(g[lo], g[hi], c))).ToArray();
        return CalculationResult<SensorCurve>.Success(
            new SensorCurve(model, nominal.Ideality, nominal.OutputPerDiodeVolt, a, b, t, residuals, basis, lambda) { ResidualsFromNominalBow = bow });
    }

    /// <summary>The curved term c(T) of the diode, volts (referred to the model's <see cref="DiodeSensorModel.ForwardAtC"/>).</summary>
    public double DiodeCurvatureVolts(double celsius) => Model is null
        ? 0.0
        : DiodeTemperatureModel.CurvatureVolts(
            celsius + ThermalVoltage.ZeroCelsiusKelvin, Model.ForwardAtC + ThermalVoltage.ZeroCelsiusKelvin, Model.Xti, Ideality);

    /// <summary>The modelled output at <paramref name="celsius"/>.</summary>
    public double OutputAt(double celsius) => Intercept + (Slope * celsius) + (CurvatureScale * OutputPerDiodeVolt * DiodeCurvatureVolts(celsius));

    /// <summary>
    /// The least-squares weights wᵢ(T) of the calibration points at <paramref name="celsius"/>: an error δᵢ in point i
    /// moves the fitted curve at T by wᵢ(T)·δᵢ. With the curvature from the model, the straight part's
    /// (wᵢ = 1/N + (T − T̄)(Tᵢ − T̄)/Sxx); with the curvature fitted, the three-term fit's (x(T)ᵀ·(XᵀX)⁻¹·xᵢ, which for
    /// three points are the Lagrange-like weights that are 1 at their own point and 0 at the others).
    /// </summary>
    public double[] Weights(double celsius) => _basis is { } basis
        ? basis.Weights(celsius, OutputPerDiodeVolt * DiodeCurvatureVolts(celsius))
        : _pointsC.Select(ti => (1.0 / _pointsC.Length) + ((celsius - _meanC) * (ti - _meanC) / _sxx)).ToArray();

    /// <summary>
    /// The temperature error at <paramref name="celsius"/>, °C, left by a true output that differs from the model by
    /// <paramref name="deltaOutput"/>(T) after the calibration points have absorbed its straight part:
    /// (Δ(T) − Σ wᵢ(T)·Δ(Tᵢ))/b. A Δ that is straight in T leaves nothing.
    /// </summary>
    public double ShapeErrorC(Func<double, double> deltaOutput, double celsius)
    {
        ArgumentNullException.ThrowIfNull(deltaOutput);
        var w = Weights(celsius);
        var absorbed = 0.0;
        for (var i = 0; i < w.Length; i++)
        {
            absorbed += w[i] * deltaOutput(_pointsC[i]);
        }

        return (deltaOutput(celsius) - absorbed) / Slope;
    }

    /// <summary>The minimax straight line of the modelled output over [<paramref name="lowC"/>, <paramref name="highC"/>].</summary>
    public MinimaxLineResult MinimaxLine(double lowC, double highC) => Calibration.MinimaxLine.Fit(OutputAt, lowC, highC);

    /// <summary>
    /// Samples of the modelled curve over [<paramref name="lowC"/>, <paramref name="highC"/>] as calibration points
    /// (for a firmware polynomial fitted to the model over the rated range).
    /// </summary>
    public IReadOnlyList<CalibrationPoint> Samples(double lowC, double highC, int count = 91) =>
        Enumerable.Range(0, count)
            .Select(i => lowC + ((highC - lowC) * i / (count - 1)))
            .Select(c => new CalibrationPoint(string.Create(CultureInfo.InvariantCulture, $"model@{c:0.##}"), c, OutputAt(c)))
            .ToList();
}
