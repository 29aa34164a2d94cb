namespace LineTest.Core.Calibration;

/// <summary>
/// A least-squares polynomial y = c0 + c1·x (+ c2·x²) with its statistics.
/// </summary>
/// <remarks>
/// With n points and p = order + 1 coefficients there are n − p degrees of freedom. When n = p the
/// curve passes through every point, the residual scatter cannot be estimated, and
/// <see cref="StandardErrors"/> and <see cref="ResidualStandardDeviation"/> are null (not zero: zero
/// would claim a perfect measurement).
/// </remarks>
public sealed record PolynomialFit
{
    /// <summary>The order of the polynomial.</summary>
    public required FitOrder Order { get; init; }

    /// <summary>Coefficients, lowest power first: c0, c1 (, c2).</summary>
    public required IReadOnlyList<double> Coefficients { get; init; }

    /// <summary>
    /// Standard error of each coefficient, sqrt of the diagonal of s²·(XᵀWX)⁻¹ with s² from n − p
    /// degrees of freedom; null when n = p.
    /// </summary>
    public required IReadOnlyList<double>? StandardErrors { get; init; }

    /// <summary>Residuals y − fit(x), in the order of the input points.</summary>
    public required IReadOnlyList<double> Residuals { get; init; }

    /// <summary>
    /// Residual standard deviation s = sqrt(Σ wᵢ·rᵢ² / (n − p)) (the standard deviation of a point of
    /// weight 1); null when n = p.
    /// </summary>
    public required double? ResidualStandardDeviation { get; init; }

    /// <summary>Number of points fitted.</summary>
    public required int Count { get; init; }

    /// <summary>Degrees of freedom n − p.</summary>
    public int DegreesOfFreedom => Count - Coefficients.Count;

    /// <summary>Constant term c0.</summary>
    public double Intercept => Coefficients[0];

    /// <summary>Linear coefficient c1.</summary>
    public double Slope => Coefficients[1];

    /// <summary>Quadratic coefficient c2, or 0 for a straight line.</summary>
    public double Curvature => Coefficients.Count > 2 ? Coefficients[2] : 0.0;

    /// <summary>Largest absolute residual.</summary>
    public double MaxAbsResidual => Residuals.Count == 0 ? 0.0 : Residuals.Max(Math.Abs);

    /// <summary>The fitted value at x.</summary>
    public double Evaluate(double x)
    {
        // Horner's rule.
        var y = 0.0;
        for (var i = Coefficients.Count - 1; i >= 0; i--)
        {
            y = (y * x) + Coefficients[i];
        }

        return y;
    }

    /// <summary>The derivative dy/dx of the fitted polynomial at x.</summary>
    public double DerivativeAt(double x) => Slope + (2.0 * Curvature * x);
}
