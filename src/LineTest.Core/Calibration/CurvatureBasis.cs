namespace LineTest.Core.Calibration;

/// <summary>
/// The three-term least squares y ≈ a + b·T + λ·g(T) of <see cref="SensorCurve.FitWithCurvature"/>, held as the inverse
/// of its normal matrix in the centred and scaled basis x(T) = (1, (T − T̄)/s_T, (g − ḡ)/s_g), so that the weights of
/// the points at any temperature and the coefficients come from one 3×3 inverse.
/// </summary>
internal sealed class CurvatureBasis
{
    // Below this the scaled normal matrix is singular for practical purposes: the points do not see g's curvature.
    private const double SingularDeterminant = 1e-9;

    private readonly double _meanC;
    private readonly double _scaleC;
    private readonly double _meanG;
    private readonly double _scaleG;
    private readonly double[][] _rows;
    private readonly double[,] _inverse;

    private CurvatureBasis(double meanC, double scaleC, double meanG, double scaleG, double[][] rows, double[,] inverse)
    {
        _meanC = meanC;
        _scaleC = scaleC;
        _meanG = meanG;
        _scaleG = scaleG;
        _rows = rows;
        _inverse = inverse;
    }

    /// <summary>The basis for points at <paramref name="celsius"/> with curved term <paramref name="g"/>; null when singular.</summary>
    public static CurvatureBasis? Create(IReadOnlyList<double> celsius, IReadOnlyList<double> g)
    {
        var meanC = celsius.Average();
        var meanG = g.Average();
        var scaleC = Math.Sqrt(celsius.Sum(t => (t - meanC) * (t - meanC)));
        var scaleG = Math.Sqrt(g.Sum(v => (v - meanG) * (v - meanG)));
        if (!(scaleC > 0) || !(scaleG > 0) || !double.IsFinite(scaleC) || !double.IsFinite(scaleG))
        {
            return null;
        }

        var rows = celsius.Select((t, i) => new[] { 1.0, (t - meanC) / scaleC, (g[i] - meanG) / scaleG }).ToArray();
        var normal = new double[3, 3];
        foreach (var row in rows)
        {
            for (var r = 0; r < 3; r++)
            {
                for (var c = 0; c < 3; c++)
                {
                    normal[r, c] += row[r] * row[c];
                }
            }
        }

        var inverse = Invert(normal, rows.Length);
        return inverse is null ? null : new CurvatureBasis(meanC, scaleC, meanG, scaleG, rows, inverse);
    }

    /// <summary>wᵢ(T) = x(T)ᵀ·(XᵀX)⁻¹·xᵢ for the curved term <paramref name="g"/> = g(T).</summary>
    public double[] Weights(double celsius, double g)
    {
        var x = new[] { 1.0, (celsius - _meanC) / _scaleC, (g - _meanG) / _scaleG };
        var left = new double[3];
        for (var c = 0; c < 3; c++)
        {
            left[c] = (x[0] * _inverse[0, c]) + (x[1] * _inverse[1, c]) + (x[2] * _inverse[2, c]);
        }

        return _rows.Select(row => (left[0] * row[0]) + (left[1] * row[1]) + (left[2] * row[2])).ToArray();
    }

    /// <summary>(a, b, λ) of y ≈ a + b·T + λ·g(T) for outputs <paramref name="y"/> in the points' order.</summary>
    public (double A, double B, double Lambda) Coefficients(IReadOnlyList<double> y)
    {
        var xty = new double[3];
        for (var i = 0; i < _rows.Length; i++)
        {
            for (var r = 0; r < 3; r++)
            {
                xty[r] += _rows[i][r] * y[i];
            }
        }

        var beta = new double[3];
        for (var r = 0; r < 3; r++)
        {
            beta[r] = (_inverse[r, 0] * xty[0]) + (_inverse[r, 1] * xty[1]) + (_inverse[r, 2] * xty[2]);
        }

        var b = beta[1] / _scaleC;
        var lambda = beta[2] / _scaleG;
        return (beta[0] - (b * _meanC) - (lambda * _meanG), b, lambda);
    }

    /// <summary>The inverse of the 3×3 normal matrix (<see cref="Stability.SmallMatrix"/>); null when it is (near) singular.</summary>
    private static double[,]? Invert(double[,] m, int count)
    {
        var det = (m[0, 0] * ((m[1, 1] * m[2, 2]) - (m[1, 2] * m[2, 1])))
            + (m[0, 1] * ((m[1, 2] * m[2, 0]) - (m[1, 0] * m[2, 2])))
            + (m[0, 2] * ((m[1, 0] * m[2, 1]) - (m[1, 1] * m[2, 0])));

        // The scaled columns have unit length (and the first √N), so the determinant compares with 1 per point.
        if (!(Math.Abs(det) > SingularDeterminant * count) || !double.IsFinite(det))
        {
            return null;
        }

        return Stability.SmallMatrix.TryInvert(m, out var inverse) ? inverse : null;
    }
}
