using System.Globalization;
using LineTest.Core.Calibration;
using LineTest.Core.Characterisation;

namespace LineTest.Core.Decisions;

/// <summary>
/// The error budget of a trimmed unit over its rated range: at each temperature of a grid, the predicted error
/// e(T) = indicated(y(T)) − T, with y(T) the unit's modelled output (<see cref="SensorCurve"/>) and indicated() the trim,
/// and its standard uncertainty from the calibration points (reference and output, through the fit's weights wᵢ(T)),
/// the sensor model's unit-to-unit spread (what the calibration points cannot absorb), and where a trim has them,
/// fitted-part tolerances. Combined by JCGM 100:2008 §5.1.2 (uncorrelated inputs), with Welch–Satterthwaite ν_eff (G.4.1)
/// and k = t₉₅.₄₅(ν_eff) (<see cref="CoverageFactor"/>).
/// </summary>
/// <remarks>
/// <para>Sensitivities: an error δᵢ in the reference at point i moves the indicated temperature at T by wᵢ(T)·δᵢ; an
/// error εᵢ in the unit's mean output by −wᵢ(T)·εᵢ/b (b the output per °C). A model parameter p with spread σ_p changes
/// the true output by Δ(T) = κ·σ_p·∂c/∂p; after the calibration points absorb its straight part the error left is
/// (Δ(T) − Σ wᵢ(T)·Δ(Tᵢ))/b (<see cref="SensorCurve.ShapeErrorC"/>). EG enters only the straight part, so its spread
/// leaves nothing after two points; XTI and n scale the curvature; the stage's non-linearity β adds β·(V_f(T) − V_f(T_c))².</para>
/// <para>The trim's resolution (DAC steps, coefficient LSBs) is known for each unit, so its effect is in e(T) itself; for
/// the floor of a population (what any trim with these steps leaves, averaged over units) it enters as a rectangular
/// component, the <c>resolutionC</c> argument of <see cref="Predict"/>.</para>
/// </remarks>
public static class RatedRangeBudget
{
    /// <summary>Default number of temperatures in the grid over the rated range.</summary>
    public const int DefaultGridPoints = 91;

    /// <summary>Predicts the error and its uncertainty over [<paramref name="lowC"/>, <paramref name="highC"/>].</summary>
    /// <param name="curve">The unit's output through its calibration points.</param>
    /// <param name="indicatedC">The trimmed unit's indicated temperature for an untrimmed output (<c>ITrimResult.IndicatedC</c>).</param>
    /// <param name="points">The uncertainties of the calibration points, in the curve's point order.</param>
    /// <param name="lowC">Low end of the rated range, °C.</param>
    /// <param name="highC">High end of the rated range, °C.</param>
    /// <param name="idealityStdDev">u of the ideality used: from the unit's own I–V sweep, or null for the model's spread.</param>
    /// <param name="partToleranceC">Standard uncertainty from fitted-part tolerance at a temperature, °C (resistor trims), or null.</param>
    /// <param name="resolutionC">Standard uncertainty of the trim's resolution at a temperature, °C, for the floor only, or null.</param>
    /// <param name="gridPoints">Temperatures in the grid, evenly spaced, both ends included.</param>
    /// <param name="soakResidualHalfWidthC">
    /// Bound on how far the unit still lags its well when a calibration point is read, °C (rectangular, independent at
    /// each point: the unit approaches each setpoint from its own side).
    /// </param>
    /// <param name="wellUniformityHalfWidthC">
    /// Bound on the difference between the unit's well and the reference well, °C (rectangular, the same at every point
    /// of a slot, so it moves the whole curve: sensitivity Σwᵢ = 1).
    /// </param>
    public static RatedRangePrediction Predict(
        SensorCurve curve,
        Func<double, double> indicatedC,
        IReadOnlyList<PointUncertainty> points,
        double lowC,
        double highC,
        double? idealityStdDev = null,
        Func<double, double>? partToleranceC = null,
        Func<double, double>? resolutionC = null,
        int gridPoints = DefaultGridPoints,
        double soakResidualHalfWidthC = 0,
        double wellUniformityHalfWidthC = 0)
    {
        ArgumentNullException.ThrowIfNull(curve);
        ArgumentNullException.ThrowIfNull(indicatedC);
        ArgumentNullException.ThrowIfNull(points);
        ArgumentOutOfRangeException.ThrowIfLessThan(gridPoints, 2);
        if (points.Count != curve.PointsC.Count)
        {
            throw new ArgumentException($"{points.Count} point uncertainties for {curve.PointsC.Count} calibration points.", nameof(points));
        }

        if (!(highC > lowC) || !double.IsFinite(lowC) || !double.IsFinite(highC))
        {
            throw new ArgumentOutOfRangeException(nameof(highC), highC, "The rated range must have a finite high above its low.");
        }

        var shapes = ModelShapes(curve, idealityStdDev, lowC, highC);
        // The component names of each calibration point, the same at every grid temperature.
        var labels = curve.PointsC.Select(c => string.Create(CultureInfo.InvariantCulture, $"{c:0.##} degC"))
            .Select(at => (Reference: $"reference at {at}", Output: $"output at {at}", Soak: $"soak residual at {at}")).ToArray();
        var grid = new RatedRangePoint[gridPoints];
        for (var g = 0; g < gridPoints; g++)
        {
            var t = lowC + ((highC - lowC) * g / (gridPoints - 1));
            var w = curve.Weights(t);
            var components = new List<UncertaintyComponent>();
            for (var i = 0; i < points.Count; i++)
            {
                components.Add(UncertaintyComponent.FromStandard(labels[i].Reference, points[i].ReferenceC, UncertaintyType.B, w[i], points[i].ReferenceDegreesOfFreedom));
                components.Add(UncertaintyComponent.FromStandard(labels[i].Output, points[i].Output, UncertaintyType.A, w[i] / curve.Slope, points[i].OutputDegreesOfFreedom));
                if (soakResidualHalfWidthC > 0)
                {
                    components.Add(UncertaintyComponent.FromRectangular(labels[i].Soak, soakResidualHalfWidthC, w[i]));
                }
            }

            if (wellUniformityHalfWidthC > 0)
            {
                components.Add(UncertaintyComponent.FromRectangular("well uniformity", wellUniformityHalfWidthC));
            }

            foreach (var (name, delta) in shapes)
            {
                components.Add(UncertaintyComponent.FromStandard(name, Math.Abs(curve.ShapeErrorC(delta, t)), UncertaintyType.B));
            }

            if (partToleranceC is not null)
            {
                components.Add(UncertaintyComponent.FromStandard("fitted-part tolerance", Math.Abs(partToleranceC(t)), UncertaintyType.B));
            }

            var budget = new UncertaintyBudget(components);
            var u = budget.CombinedStandardUncertainty;
            var resolution = resolutionC is null ? 0.0 : resolutionC(t);
            grid[g] = new RatedRangePoint(t, indicatedC(curve.OutputAt(t)) - t, u, budget.EffectiveDegreesOfFreedom, Math.Sqrt((u * u) + (resolution * resolution)))
            {
                Budget = budget,
            };
        }

        return new RatedRangePrediction(lowC, highC, grid);
    }

    /// <summary>The changes of the true output, per 1σ of each model parameter, that the calibration cannot see.</summary>
    private static List<(string Name, Func<double, double> Delta)> ModelShapes(SensorCurve curve, double? idealityStdDev, double lowC, double highC)
    {
        var shapes = new List<(string, Func<double, double>)>();
        if (curve.Model is not { } model)
        {
            return shapes;
        }

        var kappa = curve.OutputPerDiodeVolt;
        var t1 = model.ForwardAtC + ThermalVoltage.ZeroCelsiusKelvin;
        shapes.Add(("sensor model XTI", t => kappa * (model.XtiStdDev / model.Xti) * curve.DiodeCurvatureVolts(t)));
        var nSpread = idealityStdDev ?? model.IdealityStdDev;
        shapes.Add(("sensor model ideality", t => kappa * (nSpread / curve.Ideality) * curve.DiodeCurvatureVolts(t)));
        shapes.Add(("sensor model band gap", t => kappa * model.BandGapEvStdDev * (1 - ((t + ThermalVoltage.ZeroCelsiusKelvin) / t1))));
        var centre = model.TypicalForwardVolts((lowC + highC) / 2, curve.Ideality);
        shapes.Add(("read-out non-linearity", t =>
        {
            var dv = model.TypicalForwardVolts(t, curve.Ideality) - centre;
            return kappa * model.NonLinearityPerVoltStdDev * dv * dv;
        }));
        return shapes;
    }
}
