using System.Globalization;

namespace LineTest.Core.Calibration;

/// <summary>
/// Weighted least-squares polynomial fit y ≈ c0 + c1·x (+ c2·x²).
/// </summary>
/// <remarks>
/// Solved by Householder QR of the weighted, column-equilibrated design matrix rather than by the
/// normal equations: a quadratic in raw ADC counts (x up to tens of thousands, x² up to 10⁹) squares an
/// already large condition number in the normal equations, but not in QR.
/// Coefficient covariance is s²·(XᵀWX)⁻¹ with s² = Σ wᵢ·rᵢ² / (n − p).
/// </remarks>
public static class LeastSquares
{
    // Relative size of a diagonal element of R (columns scaled to unit norm) below which the design
    // matrix is treated as rank-deficient: the points are too close together to separate the terms.
    private const double RankTolerance = 1e-12;

    /// <summary>
    /// Fits a polynomial of the given order. Returns a failure (not an exception) for too few points,
    /// too few distinct x, non-finite values or non-positive weights.
    /// </summary>
    /// <param name="x">Abscissae.</param>
    /// <param name="y">Ordinates, same length as <paramref name="x"/>.</param>
    /// <param name="order">Linear or quadratic.</param>
    /// <param name="weights">Optional positive weights (e.g. 1/u²), same length; null for equal weights.</param>
    /// <param name="labels">Optional point names used in failure reasons, same length.</param>
    /// <param name="xName">What x is, used in failure reasons (e.g. "reference temperature").</param>
    public static CalculationResult<PolynomialFit> Fit(
        IReadOnlyList<double> x,
        IReadOnlyList<double> y,
        FitOrder order,
        IReadOnlyList<double>? weights = null,
        IReadOnlyList<string>? labels = null,
        string xName = "x")
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(y);
        if (order is not (FitOrder.Linear or FitOrder.Quadratic))
        {
            throw new ArgumentOutOfRangeException(nameof(order), order, "Fit order must be Linear or Quadratic.");
        }

        if (y.Count != x.Count)
        {
            throw new ArgumentException($"y has {y.Count} values but x has {x.Count}.", nameof(y));
        }

        if (weights is not null && weights.Count != x.Count)
        {
            throw new ArgumentException($"weights has {weights.Count} values but x has {x.Count}.", nameof(weights));
        }

        if (labels is not null && labels.Count != x.Count)
        {
            throw new ArgumentException($"labels has {labels.Count} values but x has {x.Count}.", nameof(labels));
        }

        var n = x.Count;
        var p = (int)order + 1;
        var kind = order == FitOrder.Linear ? "a straight-line fit" : "a quadratic fit";
        if (n < p)
        {
            return CalculationResult<PolynomialFit>.Failure(
                $"{kind} needs at least {p} points, got {n}");
        }

        for (var i = 0; i < n; i++)
        {
            var where = Describe(i, labels);
            if (!double.IsFinite(x[i]))
            {
                return CalculationResult<PolynomialFit>.Failure($"{where}: {xName} is {Text(x[i])}, not a number that can be fitted");
            }

            if (!double.IsFinite(y[i]))
            {
                return CalculationResult<PolynomialFit>.Failure($"{where}: value is {Text(y[i])}, not a number that can be fitted");
            }

            if (weights is not null && !(double.IsFinite(weights[i]) && weights[i] > 0.0))
            {
                return CalculationResult<PolynomialFit>.Failure($"{where}: weight is {Text(weights[i])}; weights must be positive and finite");
            }
        }

        var distinct = x.Distinct().Count();
        if (distinct < p)
        {
            return CalculationResult<PolynomialFit>.Failure(distinct == 1
                ? $"all {n} points have the same {xName} ({Text(x[0])}): {kind} needs {p} different values"
                : $"only {distinct} different {xName} values among {n} points: {kind} needs {p}");
        }

        // Weighted design matrix A[i, j] = sqrt(wᵢ)·xᵢʲ and right-hand side b = sqrt(wᵢ)·yᵢ.
        var a = new double[n, p];
        var b = new double[n];
        for (var i = 0; i < n; i++)
        {
            var sw = Math.Sqrt(weights?[i] ?? 1.0);
            var power = 1.0;
            for (var j = 0; j < p; j++)
            {
                a[i, j] = sw * power;
                power *= x[i];
            }

            b[i] = sw * y[i];
        }

        // Equilibrate columns to unit norm so the rank test is scale-free.
        var scale = new double[p];
        for (var j = 0; j < p; j++)
        {
            var norm = 0.0;
            for (var i = 0; i < n; i++)
            {
                norm = Hypot(norm, a[i, j]);
            }

            scale[j] = norm;
            for (var i = 0; i < n; i++)
            {
                a[i, j] /= norm;
            }
        }

        HouseholderInPlace(a, b, n, p);

        for (var j = 0; j < p; j++)
        {
            if (Math.Abs(a[j, j]) < RankTolerance)
            {
                return CalculationResult<PolynomialFit>.Failure(
                    $"the {xName} values are too close together for {kind}");
            }
        }

        // Back-substitution R·z = (Qᵀb)[0..p); coefficient cⱼ = zⱼ / scaleⱼ.
        var z = new double[p];
        for (var j = p - 1; j >= 0; j--)
        {
            var sum = b[j];
            for (var k = j + 1; k < p; k++)
            {
                sum -= a[j, k] * z[k];
            }

            z[j] = sum / a[j, j];
        }

        var coefficients = new double[p];
        for (var j = 0; j < p; j++)
        {
            coefficients[j] = z[j] / scale[j];
        }

        var fitForEval = new PolynomialFit
        {
            Order = order,
            Coefficients = coefficients,
            StandardErrors = null,
            Residuals = [],
            ResidualStandardDeviation = null,
            Count = n,
        };

        var residuals = new double[n];
        var weightedSquares = 0.0;
        for (var i = 0; i < n; i++)
        {
            residuals[i] = y[i] - fitForEval.Evaluate(x[i]);
            weightedSquares += (weights?[i] ?? 1.0) * residuals[i] * residuals[i];
        }

        var dof = n - p;
        double? s = null;
        double[]? standardErrors = null;
        if (dof > 0)
        {
            var variance = weightedSquares / dof;
            s = Math.Sqrt(variance);

            // (AᵀA)⁻¹ = R⁻¹·R⁻ᵀ; var(cⱼ) = s²·Σₖ (R⁻¹)ⱼₖ² / scaleⱼ².
            var rInverse = InvertUpperTriangular(a, p);
            standardErrors = new double[p];
            for (var j = 0; j < p; j++)
            {
                var sum = 0.0;
                for (var k = j; k < p; k++)
                {
                    sum += rInverse[j, k] * rInverse[j, k];
                }

                standardErrors[j] = Math.Sqrt(variance * sum) / scale[j];
            }
        }

        return CalculationResult<PolynomialFit>.Success(fitForEval with
        {
            Residuals = residuals,
            ResidualStandardDeviation = s,
            StandardErrors = standardErrors,
        });
    }

    private static void HouseholderInPlace(double[,] a, double[] b, int n, int p)
    {
        var v = new double[n];
        for (var j = 0; j < p; j++)
        {
            var norm = 0.0;
            for (var i = j; i < n; i++)
            {
                norm = Hypot(norm, a[i, j]);
            }

            if (norm == 0.0)
            {
                continue;
            }

            // Reflect column j onto −sign(a_jj)·‖x‖·e_j to avoid cancellation.
            var alpha = a[j, j] > 0 ? -norm : norm;
            for (var i = j; i < n; i++)
            {
                v[i] = a[i, j];
            }

            v[j] -= alpha;
            var vNormSquared = 0.0;
            for (var i = j; i < n; i++)
            {
                vNormSquared += v[i] * v[i];
            }

            if (vNormSquared == 0.0)
            {
                continue;
            }

            for (var k = j; k < p; k++)
            {
                var dot = 0.0;
                for (var i = j; i < n; i++)
                {
                    dot += v[i] * a[i, k];
                }

                var f = 2.0 * dot / vNormSquared;
                for (var i = j; i < n; i++)
                {
                    a[i, k] -= f * v[i];
                }
            }

            var dotB = 0.0;
            for (var i = j; i < n; i++)
            {
                dotB += v[i] * b[i];
            }

            var fb = 2.0 * dotB / vNormSquared;
            for (var i = j; i < n; i++)
            {
                b[i] -= fb * v[i];
            }
        }
    }

    private static double[,] InvertUpperTriangular(double[,] r, int p)
    {
        var inverse = new double[p, p];
        for (var col = 0; col < p; col++)
        {
            for (var row = col; row >= 0; row--)
            {
                var sum = row == col ? 1.0 : 0.0;
                for (var k = row + 1; k <= col; k++)
                {
                    sum -= r[row, k] * inverse[k, col];
                }

                inverse[row, col] = sum / r[row, row];
            }
        }

        return inverse;
    }

    private static double Hypot(double a, double b) => Math.Sqrt((a * a) + (b * b));

    private static string Describe(int index, IReadOnlyList<string>? labels) =>
        labels is null
            ? string.Create(CultureInfo.InvariantCulture, $"point {index + 1}")
            : string.Create(CultureInfo.InvariantCulture, $"point {index + 1} ('{labels[index]}')");

    private static string Text(double value) => value.ToString("G6", CultureInfo.InvariantCulture);
}
