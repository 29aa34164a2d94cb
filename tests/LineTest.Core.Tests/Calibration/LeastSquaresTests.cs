using CsCheck;
using LineTest.Core.Calibration;
using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.LinearRegression;

namespace LineTest.Core.Tests.Calibration;

public sealed class LeastSquaresTests
{
    [Fact]
    public void Fit_ThreePointLine_MatchesHandWorkedValues()
    {
        // Hand-worked: x = 0,1,2; y = 1,3,4. x̄ = 1, ȳ = 8/3, Sxx = 2,
        // Sxy = (−1)(1 − 8/3) + 0 + (1)(4 − 8/3) = 5/3 + 4/3 = 3 → b = 3/2, a = 8/3 − 3/2 = 7/6.
        // Residuals: 1 − 7/6 = −1/6; 3 − 8/3 = 1/3; 4 − 25/6 = −1/6. SSR = 6/36 = 1/6, n − p = 1,
        // s² = 1/6 → s = 0.408248. se(b) = s/√Sxx = √(1/12) = 0.288675;
        // se(a) = s·√(1/n + x̄²/Sxx) = √(1/6·5/6) = √5/6 = 0.372678.
        var fit = LeastSquares.Fit([0, 1, 2], [1, 3, 4], FitOrder.Linear).Value;

        Assert.Equal(7.0 / 6.0, fit.Intercept, 12);
        Assert.Equal(1.5, fit.Slope, 12);
        Assert.Equal([-1.0 / 6.0, 1.0 / 3.0, -1.0 / 6.0], fit.Residuals.ToArray(), new ToleranceComparer(1e-12));
        Assert.Equal(Math.Sqrt(1.0 / 6.0), fit.ResidualStandardDeviation!.Value, 12);
        Assert.Equal(Math.Sqrt(5.0) / 6.0, fit.StandardErrors![0], 12);
        Assert.Equal(Math.Sqrt(1.0 / 12.0), fit.StandardErrors[1], 12);
        Assert.Equal(1, fit.DegreesOfFreedom);
    }

    [Fact]
    public void Fit_TwoPointLine_PassesThroughBothAndHasNoStandardErrors()
    {
        // Hand-worked: through (−10, 0.4) and (40, 0.9): slope 0.5/50 = 0.01, intercept 0.4 + 0.1 = 0.5.
        var fit = LeastSquares.Fit([-10, 40], [0.4, 0.9], FitOrder.Linear).Value;

        Assert.Equal(0.5, fit.Intercept, 12);
        Assert.Equal(0.01, fit.Slope, 12);
        Assert.Null(fit.StandardErrors);
        Assert.Null(fit.ResidualStandardDeviation);
        Assert.Equal(0, fit.DegreesOfFreedom);
    }

    [Fact]
    public void Fit_ExactQuadraticWithFourPoints_RecoversCoefficientsWithZeroScatter()
    {
        // Hand-worked: y = 1 + x² at x = 0,1,2,3 → 1, 2, 5, 10; the fit is exact so s = 0 and every se = 0.
        var fit = LeastSquares.Fit([0, 1, 2, 3], [1, 2, 5, 10], FitOrder.Quadratic).Value;

        Assert.Equal(1.0, fit.Coefficients[0], 10);
        Assert.Equal(0.0, fit.Coefficients[1], 10);
        Assert.Equal(1.0, fit.Coefficients[2], 10);
        Assert.Equal(0.0, fit.ResidualStandardDeviation!.Value, 10);
        Assert.All(fit.StandardErrors!, se => Assert.Equal(0.0, se, 10));
    }

    [Fact]
    public void Fit_QuadraticFourPoints_MatchesHandWorkedValues()
    {
        // Hand-worked: x = −1,0,1,2; y = 2,1,2,6. Sums: Σ1 = 4, Σx = 2, Σx² = 6, Σx³ = 8, Σx⁴ = 18,
        // Σy = 11, Σxy = 12, Σx²y = 28. Normal equations:
        //   4c0 + 2c1 + 6c2 = 11;  2c0 + 6c1 + 8c2 = 12;  6c0 + 8c1 + 18c2 = 28
        // → c1 + c2 = 1.3 and 5c1 + 9c2 = 11.5 → c2 = 1.25, c1 = 0.05, c0 = 0.85.
        // Fitted 2.05, 0.85, 2.15, 5.95 → residuals −0.05, 0.15, −0.15, 0.05; SSR = 0.05, n − p = 1,
        // s = √0.05 = 0.223607.
        var fit = LeastSquares.Fit([-1, 0, 1, 2], [2, 1, 2, 6], FitOrder.Quadratic).Value;

        Assert.Equal(0.85, fit.Coefficients[0], 12);
        Assert.Equal(0.05, fit.Coefficients[1], 12);
        Assert.Equal(1.25, fit.Coefficients[2], 12);
        Assert.Equal([-0.05, 0.15, -0.15, 0.05], fit.Residuals.ToArray(), new ToleranceComparer(1e-12));
        Assert.Equal(Math.Sqrt(0.05), fit.ResidualStandardDeviation!.Value, 12);
        Assert.Equal(0.15, fit.MaxAbsResidual, 12);
    }

    [Fact]
    public void Fit_ThreePointQuadratic_HasNoStandardErrors()
    {
        var fit = LeastSquares.Fit([0, 1, 2], [1, 2, 5], FitOrder.Quadratic).Value;

        Assert.Equal(1.0, fit.Curvature, 12);
        Assert.Null(fit.StandardErrors);
        Assert.Null(fit.ResidualStandardDeviation);
    }

    [Fact]
    public void Fit_RandomLines_AgreeWithMathNetFitLine()
    {
        // MathNet.Numerics Fit.Line as an independent reference.
        Gen.Int[-500, 500].Select(i => i * 0.1).Array[3, 12]
            .Select(Gen.Double[-2, 2].Array[12], Gen.Double[-5, 5], Gen.Double[-0.1, 0.1])
            .Where(t => t.Item1.Distinct().Count() >= 2)
            .Sample((xs, noise, a, b) =>
            {
                var ys = xs.Select((x, i) => a + (b * x) + noise[i]).ToArray();
                var reference = Fit.Line(xs, ys);
                var fit = LeastSquares.Fit(xs, ys, FitOrder.Linear).Value;
                Assert.Equal(reference.A, fit.Intercept, 1e-8);
                Assert.Equal(reference.B, fit.Slope, 1e-8);
            }, iter: 200);
    }

    [Fact]
    public void Fit_RawCountQuadratics_AgreeWithMathNetFitPolynomial()
    {
        // Raw ADC counts make x² ~ 10⁹: a conditioning test. MathNet Fit.Polynomial (QR) as reference.
        Gen.Int[1000, 60000].Select(i => (double)i).Array[4, 10]
            .Select(Gen.Double[-0.05, 0.05].Array[10])
            .Where(t => t.Item1.Distinct().Count() >= 3 && t.Item1.Max() - t.Item1.Min() > 500)
            .Sample((xs, noise) =>
            {
                var ys = xs.Select((x, i) => -40.0 + (2.5e-3 * x) - (1.0e-9 * x * x) + noise[i]).ToArray();
                var reference = Fit.Polynomial(xs, ys, 2);
                var fit = LeastSquares.Fit(xs, ys, FitOrder.Quadratic).Value;
                for (var k = 0; k < xs.Length; k++)
                {
                    var expected = reference[0] + (reference[1] * xs[k]) + (reference[2] * xs[k] * xs[k]);
                    Assert.Equal(expected, fit.Evaluate(xs[k]), 1e-6);
                }
            }, iter: 200);
    }

    [Fact]
    public void Fit_Weighted_AgreesWithMathNetWeightedRegressionAndCovariance()
    {
        // MathNet WeightedRegression.Weighted (normal equations XᵀWX) as reference for coefficients, and
        // s²·(XᵀWX)⁻¹ built with MathNet matrices for the standard errors.
        // Setpoints on a 0.5 °C grid: points a few µK apart would make any two solvers disagree.
        Gen.Int[-80, 240].Select(i => i * 0.5).Array[5, 9]
            .Select(Gen.Double[0.2, 5].Array[9], Gen.Double[-0.2, 0.2].Array[9])
            .Where(t => t.Item1.Distinct().Count() >= 3 && t.Item1.Max() - t.Item1.Min() > 20)
            .Sample((xs, ws, noise) =>
            {
                var n = xs.Length;
                var ys = xs.Select((x, i) => 0.5 + (0.01 * x) + (2e-6 * x * x) + noise[i]).ToArray();
                var w = ws.Take(n).ToArray();
                var design = Matrix<double>.Build.Dense(n, 3, (i, j) => Math.Pow(xs[i], j));
                var weightMatrix = Matrix<double>.Build.Diagonal(w);
                var reference = WeightedRegression.Weighted(design, Vector<double>.Build.Dense(ys), weightMatrix);

                var fit = LeastSquares.Fit(xs, ys, FitOrder.Quadratic, w).Value;

                // Compare fitted curves, not raw coefficients: clustered x make the coefficients
                // ill-conditioned, and MathNet solves the normal equations (condition number squared).
                for (var i = 0; i < n; i++)
                {
                    var expected = reference[0] + (reference[1] * xs[i]) + (reference[2] * xs[i] * xs[i]);
                    Assert.Equal(expected, fit.Evaluate(xs[i]), 1e-7);
                }

                var residual = Vector<double>.Build.Dense(ys) - (design * reference);
                var s2 = residual.PointwiseMultiply(residual).PointwiseMultiply(Vector<double>.Build.Dense(w)).Sum() / (n - 3);
                var covariance = (design.Transpose() * weightMatrix * design).Inverse() * s2;
                for (var j = 0; j < 3; j++)
                {
                    var expected = Math.Sqrt(covariance[j, j]);
                    // Absolute floor 1e-9 as for s below: with almost noise-free data both standard errors are
                    // rounding noise, and the normal equations' rounding (seed 5I5SEUGh2jW2 gave 1.9e-12 against
                    // our 1.3e-14) is larger than QR's.
                    Assert.Equal(expected, fit.StandardErrors![j], expected * 1e-4 + 1e-9);
                }

                Assert.Equal(Math.Sqrt(s2), fit.ResidualStandardDeviation!.Value, 1e-9);
            }, iter: 100);
    }

    [Fact]
    public void Fit_EqualWeights_SameAsUnweighted()
    {
        var xs = new double[] { -20, 0, 25, 70 };
        var ys = new double[] { 0.31, 0.50, 0.76, 1.19 };
        var plain = LeastSquares.Fit(xs, ys, FitOrder.Linear).Value;
        var weighted = LeastSquares.Fit(xs, ys, FitOrder.Linear, [3, 3, 3, 3]).Value;

        Assert.Equal(plain.Coefficients.ToArray(), weighted.Coefficients.ToArray(), new ToleranceComparer(1e-12));
        Assert.Equal(plain.StandardErrors!.ToArray(), weighted.StandardErrors!.ToArray(), new ToleranceComparer(1e-12));
    }

    [Fact]
    public void Fit_OnePointLine_FailsSayingHowManyNeeded()
    {
        var result = LeastSquares.Fit([20], [0.7], FitOrder.Linear);

        Assert.False(result.Succeeded);
        Assert.Contains("at least 2 points, got 1", result.Reason);
    }

    [Fact]
    public void Fit_AllXEqual_FailsSayingSo()
    {
        var result = LeastSquares.Fit([25, 25, 25], [0.7, 0.71, 0.69], FitOrder.Linear, xName: "reference temperature");

        Assert.False(result.Succeeded);
        Assert.Contains("same reference temperature (25)", result.Reason);
    }

    [Fact]
    public void Fit_QuadraticWithTwoDistinctX_Fails()
    {
        var result = LeastSquares.Fit([0, 0, 50, 50], [1, 1, 2, 2], FitOrder.Quadratic);

        Assert.False(result.Succeeded);
        Assert.Contains("only 2 different", result.Reason);
    }

    [Fact]
    public void Fit_NaNOutput_FailsNamingThePoint()
    {
        var result = LeastSquares.Fit([0, 50], [0.5, double.NaN], FitOrder.Linear, labels: ["cold", "hot"]);

        Assert.False(result.Succeeded);
        Assert.Contains("point 2 ('hot')", result.Reason);
        Assert.Contains("NaN", result.Reason);
    }

    [Fact]
    public void Fit_ZeroWeight_FailsNamingThePoint()
    {
        var result = LeastSquares.Fit([0, 50, 100], [0.5, 1, 1.5], FitOrder.Linear, [1, 0, 1]);

        Assert.False(result.Succeeded);
        Assert.Contains("point 2", result.Reason);
        Assert.Contains("weight", result.Reason);
    }

    [Fact]
    public void Fit_XValuesNearlyEqual_FailsAsTooClose()
    {
        var result = LeastSquares.Fit([25, 25 + 1e-14, 25 + 2e-14], [0.7, 0.7, 0.7], FitOrder.Quadratic);

        Assert.False(result.Succeeded);
        Assert.Contains("too close together", result.Reason);
    }

    [Fact]
    public void Fit_MismatchedLengths_Throws()
    {
        Assert.Throws<ArgumentException>(() => LeastSquares.Fit([1, 2], [1], FitOrder.Linear));
    }
}
