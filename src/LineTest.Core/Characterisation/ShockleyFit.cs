using System.Globalization;
using LineTest.Core.Calibration;

namespace LineTest.Core.Characterisation;

/// <summary>
/// Fits a forward I–V sweep of a junction diode to the Shockley equation with series resistance,
/// <c>V = n·V_T·ln(I/I_s + 1) + I·R_s</c>, <c>V_T = k·T/q</c>, by non-linear least squares on the voltages.
/// </summary>
/// <remarks>
/// <para>
/// Parameters are (ln I_s, n, R_s): ln I_s rather than I_s because I_s spans many decades between parts and
/// temperatures and the model is close to linear in its logarithm. The Jacobian is analytic:
/// ∂V/∂ln I_s = −n·V_T·σ(x), ∂V/∂n = V_T·ln(1 + eˣ), ∂V/∂R_s = I, with x = ln I − ln I_s and σ the logistic function;
/// ln(1 + eˣ) and σ(x) are evaluated in forms that neither overflow nor lose the small terms.
/// </para>
/// <para>
/// Minimiser: Levenberg–Marquardt (Marquardt, J. SIAM 11 (1963) 431) with the columns of J scaled to unit norm, so the
/// damping λ·diag(JᵀJ) is Marquardt's scale-invariant form; λ falls ten-fold after a step that lowers the sum of
/// squares and rises ten-fold after one that does not (or that would make n non-positive). It stops when the gradient
/// is orthogonal to the residuals to within 1e-9 (the normal equations hold), the rms residual is below a picovolt
/// (exact data), or a step no longer changes the sum of
/// squares relatively by 1e-13, and fails after <see cref="MaxIterations"/> steps.
/// </para>
/// <para>
/// Start: a straight line V = c + b·ln I through the lower half of the points (where I·R_s is small) gives
/// n₀ = b/V_T and ln I_s₀ = −c/b; R_s₀ is the least-squares slope of the remaining voltage against I (not below 0).
/// </para>
/// <para>Standard errors: the square roots of the diagonal of s²·(JᵀJ)⁻¹ at the optimum, s² = Σr²/(N − 3).</para>
/// </remarks>
public static class ShockleyFit
{
    /// <summary>Fewest points accepted: three parameters and at least one degree of freedom for the residual scatter.</summary>
    public const int MinimumPoints = 4;

    /// <summary>Most Levenberg–Marquardt steps (accepted or not) before the fit is declared not converged.</summary>
    public const int MaxIterations = 200;

    private const int ParameterCount = 3;
    private const double GradientTolerance = 1e-9;
    private const double RelativeReductionTolerance = 1e-13;
    private const double MaxDamping = 1e16;

    // An rms residual below a picovolt is rounding, far below any measurement: the data are fitted exactly.
    private const double ExactFitRmsVolts = 1e-12;

    /// <summary>
    /// Fits <paramref name="points"/> (currents strictly increasing, all values positive) taken at
    /// <paramref name="kelvin"/>. Bad data and a fit that does not converge are failures with a plain reason.
    /// </summary>
    public static CalculationResult<ShockleyFitResult> Fit(IReadOnlyList<IvPoint> points, double kelvin)
    {
        ArgumentNullException.ThrowIfNull(points);
        if (!(kelvin > 0) || !double.IsFinite(kelvin))
        {
            return Fail($"the junction temperature {T(kelvin)} K is not a temperature above absolute zero");
        }

        if (CheckPoints(points) is { } problem)
        {
            return Fail(problem);
        }

        var vt = ThermalVoltage.AtKelvin(kelvin);
        var start = StartingPoint(points, vt);
        if (!start.TryGetValue(out var p0))
        {
            return Fail(start.Reason!);
        }

        return Minimise(points, vt, kelvin, p0);
    }

    /// <summary>The model voltage <c>n·V_T·ln(I/I_s + 1) + I·R_s</c> at <paramref name="currentAmps"/>, volts.</summary>
    public static double Model(double currentAmps, double lnSaturationCurrent, double ideality, double seriesResistanceOhms, double thermalVolts)
        => (ideality * thermalVolts * Softplus(Math.Log(currentAmps) - lnSaturationCurrent)) + (currentAmps * seriesResistanceOhms);

    private static string? CheckPoints(IReadOnlyList<IvPoint> points)
    {
        if (points.Count < MinimumPoints)
        {
            return string.Create(CultureInfo.InvariantCulture,
                $"an I–V fit of three parameters (I_s, n, R_s) needs at least {MinimumPoints} points, got {points.Count}");
        }

        for (var i = 0; i < points.Count; i++)
        {
            var (amps, volts) = points[i];
            var at = string.Create(CultureInfo.InvariantCulture, $"point {i + 1}");
            if (!double.IsFinite(amps) || amps <= 0)
            {
                return $"{at}: the current is {T(amps)} A; sweep currents must be positive numbers";
            }

            if (!double.IsFinite(volts) || volts <= 0)
            {
                return $"{at}: the voltage is {T(volts)} V at {T(amps)} A; a forward-biased junction gives a positive voltage (reversed or open connection?)";
            }

            if (i > 0 && amps <= points[i - 1].CurrentAmps)
            {
                return $"{at}: the current {T(amps)} A is not above the previous point's {T(points[i - 1].CurrentAmps)} A; sweep currents must increase";
            }

            if (i > 0 && volts <= points[i - 1].Volts)
            {
                return $"{at}: the voltage {T(volts)} V is not above {T(points[i - 1].Volts)} V at the lower current before it; a junction's forward voltage rises with current (intermittent contact or noise?)";
            }
        }

        return null;
    }

    private static CalculationResult<double[]> StartingPoint(IReadOnlyList<IvPoint> points, double vt)
    {
        var low = Math.Max(2, (points.Count + 1) / 2);
        var lnI = points.Take(low).Select(p => Math.Log(p.CurrentAmps)).ToArray();
        var v = points.Take(low).Select(p => p.Volts).ToArray();
        var line = LeastSquares.Fit(lnI, v, FitOrder.Linear, xName: "ln I");
        if (!line.TryGetValue(out var fit))
        {
            return CalculationResult<double[]>.Failure($"no starting line through the low-current points: {line.Reason}");
        }

        if (!(fit.Slope > 0))
        {
            return CalculationResult<double[]>.Failure("the voltage does not rise with the logarithm of the current at the low-current points");
        }

        var lnIs = -fit.Intercept / fit.Slope;
        var n = fit.Slope / vt;
        double sumIr = 0, sumII = 0;
        foreach (var point in points)
        {
            var remaining = point.Volts - (fit.Intercept + (fit.Slope * Math.Log(point.CurrentAmps)));
            sumIr += point.CurrentAmps * remaining;
            sumII += point.CurrentAmps * point.CurrentAmps;
        }

        var rs = Math.Max(0, sumIr / sumII);
        return CalculationResult<double[]>.Success([lnIs, n, rs]);
    }

    private static CalculationResult<ShockleyFitResult> Minimise(IReadOnlyList<IvPoint> points, double vt, double kelvin, double[] p)
    {
        var count = points.Count;
        var residuals = new double[count];
        var jacobian = new double[count, ParameterCount];
        var sum = Evaluate(points, vt, p, residuals, jacobian);
        if (!double.IsFinite(sum))
        {
            return Fail("the starting point of the fit gives voltages that are not numbers");
        }

        var damping = 1e-3;
        var iterations = 0;
        var trial = new double[ParameterCount];
        var trialResiduals = new double[count];
        while (true)
        {
            var (a, g, scale) = ScaledNormalEquations(jacobian, residuals, count);
            var residualNorm = Math.Sqrt(sum);
            if (residualNorm <= ExactFitRmsVolts * Math.Sqrt(count) || MaxAbs(g) <= GradientTolerance * residualNorm)
            {
                break;
            }

            if (iterations >= MaxIterations)
            {
                return Fail(string.Create(CultureInfo.InvariantCulture,
                    $"the fit did not converge within {MaxIterations} iterations (last n = {T(p[1])}, R_s = {T(p[2])} Ω): the curve does not follow the Shockley equation"));
            }

            iterations++;
            var damped = (double[,])a.Clone();
            for (var j = 0; j < ParameterCount; j++)
            {
                damped[j, j] += damping * a[j, j];
            }

            var step = SolveCholesky(damped, g);
            var usable = step is not null;
            if (usable)
            {
                for (var j = 0; j < ParameterCount; j++)
                {
                    trial[j] = p[j] + (step![j] / scale[j]);
                }

                usable = trial.All(double.IsFinite) && trial[1] > 0;
            }

            var trialSum = usable ? Evaluate(points, vt, trial, trialResiduals, null) : double.NaN;
            if (usable && double.IsFinite(trialSum) && trialSum < sum)
            {
                var reduction = (sum - trialSum) / sum;
                Array.Copy(trial, p, ParameterCount);
                sum = Evaluate(points, vt, p, residuals, jacobian);
                damping = Math.Max(damping / 10, 1e-12);
                if (reduction < RelativeReductionTolerance)
                {
                    break;
                }
            }
            else
            {
                damping *= 10;
                if (damping > MaxDamping)
                {
                    // No step lowers the sum any further: that is an optimum only where the gradient has (nearly) vanished.
                    var (_, gNow, _) = ScaledNormalEquations(jacobian, residuals, count);
                    if (Math.Sqrt(sum) <= ExactFitRmsVolts * Math.Sqrt(count) || MaxAbs(gNow) <= 1e-6 * Math.Sqrt(sum))
                    {
                        break;
                    }

                    return Fail("the fit stalled before reaching a minimum: the curve does not follow the Shockley equation");
                }
            }
        }

        var dof = count - ParameterCount;
        var variance = sum / dof;
        var (final, _, finalScale) = ScaledNormalEquations(jacobian, residuals, count);
        var inverse = InvertCholesky(final);
        if (inverse is null)
        {
            return Fail("the sweep does not separate I_s, n and R_s (the currents span too little range)");
        }

        double Se(int j) => Math.Sqrt(variance * inverse[j, j]) / finalScale[j];
        return CalculationResult<ShockleyFitResult>.Success(new ShockleyFitResult
        {
            Kelvin = kelvin,
            ThermalVolts = vt,
            LnSaturationCurrent = p[0],
            Ideality = p[1],
            SeriesResistanceOhms = p[2],
            LnSaturationCurrentStandardError = Se(0),
            IdealityStandardError = Se(1),
            SeriesResistanceStandardErrorOhms = Se(2),
            ResidualsVolts = residuals.ToArray(),
            ResidualStandardDeviationVolts = Math.Sqrt(variance),
            Iterations = iterations,
        });
    }

    /// <summary>Residuals (measured − model), optionally the model Jacobian; returns Σr².</summary>
    private static double Evaluate(IReadOnlyList<IvPoint> points, double vt, double[] p, double[] residuals, double[,]? jacobian)
    {
        var sum = 0.0;
        for (var i = 0; i < points.Count; i++)
        {
            var (amps, volts) = points[i];
            var x = Math.Log(amps) - p[0];
            var softplus = Softplus(x);
            residuals[i] = volts - ((p[1] * vt * softplus) + (amps * p[2]));
            sum += residuals[i] * residuals[i];
            if (jacobian is not null)
            {
                jacobian[i, 0] = -p[1] * vt * Logistic(x);
                jacobian[i, 1] = vt * softplus;
                jacobian[i, 2] = amps;
            }
        }

        return sum;
    }

    /// <summary>JᵀJ and Jᵀr with J's columns scaled to unit norm (D = column norms), and D.</summary>
    private static (double[,] A, double[] G, double[] Scale) ScaledNormalEquations(double[,] jacobian, double[] residuals, int count)
    {
        var scale = new double[ParameterCount];
        for (var j = 0; j < ParameterCount; j++)
        {
            var norm = 0.0;
            for (var i = 0; i < count; i++)
            {
                norm += jacobian[i, j] * jacobian[i, j];
            }

            scale[j] = norm > 0 ? Math.Sqrt(norm) : 1.0;
        }

        var a = new double[ParameterCount, ParameterCount];
        var g = new double[ParameterCount];
        for (var j = 0; j < ParameterCount; j++)
        {
            for (var i = 0; i < count; i++)
            {
                g[j] += jacobian[i, j] / scale[j] * residuals[i];
            }

            for (var k = 0; k < ParameterCount; k++)
            {
                for (var i = 0; i < count; i++)
                {
                    a[j, k] += jacobian[i, j] / scale[j] * (jacobian[i, k] / scale[k]);
                }
            }
        }

        return (a, g, scale);
    }

    private static double[,]? CholeskyFactor(double[,] a)
    {
        var l = new double[ParameterCount, ParameterCount];
        for (var j = 0; j < ParameterCount; j++)
        {
            var d = a[j, j];
            for (var k = 0; k < j; k++)
            {
                d -= l[j, k] * l[j, k];
            }

            // A pivot this small relative to the unit diagonal means the columns are linearly dependent.
            if (!(d > 1e-14))
            {
                return null;
            }

            l[j, j] = Math.Sqrt(d);
            for (var i = j + 1; i < ParameterCount; i++)
            {
                var s = a[i, j];
                for (var k = 0; k < j; k++)
                {
                    s -= l[i, k] * l[j, k];
                }

                l[i, j] = s / l[j, j];
            }
        }

        return l;
    }

    private static double[]? SolveCholesky(double[,] a, double[] b)
    {
        if (CholeskyFactor(a) is not { } l)
        {
            return null;
        }

        var y = new double[ParameterCount];
        for (var i = 0; i < ParameterCount; i++)
        {
            var s = b[i];
            for (var k = 0; k < i; k++)
            {
                s -= l[i, k] * y[k];
            }

            y[i] = s / l[i, i];
        }

        var x = new double[ParameterCount];
        for (var i = ParameterCount - 1; i >= 0; i--)
        {
            var s = y[i];
            for (var k = i + 1; k < ParameterCount; k++)
            {
                s -= l[k, i] * x[k];
            }

            x[i] = s / l[i, i];
        }

        return x;
    }

    private static double[,]? InvertCholesky(double[,] a)
    {
        var inverse = new double[ParameterCount, ParameterCount];
        for (var c = 0; c < ParameterCount; c++)
        {
            var unit = new double[ParameterCount];
            unit[c] = 1;
            if (SolveCholesky(a, unit) is not { } column)
            {
                return null;
            }

            for (var r = 0; r < ParameterCount; r++)
            {
                inverse[r, c] = column[r];
            }
        }

        return inverse;
    }

    /// <summary>ln(1 + eˣ) without overflow for large x or loss of the small term for very negative x.</summary>
    private static double Softplus(double x) => x > 0 ? x + double.LogP1(Math.Exp(-x)) : double.LogP1(Math.Exp(x));

    /// <summary>1 / (1 + e⁻ˣ) without overflow.</summary>
    private static double Logistic(double x) => x >= 0 ? 1 / (1 + Math.Exp(-x)) : Math.Exp(x) / (1 + Math.Exp(x));

    private static double MaxAbs(double[] values) => values.Max(Math.Abs);

    private static CalculationResult<ShockleyFitResult> Fail(string reason) => CalculationResult<ShockleyFitResult>.Failure(reason);

    private static string T(double value) => value.ToString("G5", CultureInfo.InvariantCulture);
}
