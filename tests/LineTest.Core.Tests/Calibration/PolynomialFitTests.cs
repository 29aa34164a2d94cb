using LineTest.Core.Calibration;

namespace LineTest.Core.Tests.Calibration;

public sealed class PolynomialFitTests
{
    private static PolynomialFit Quadratic(params double[] coefficients) => new()
    {
        Order = FitOrder.Quadratic,
        Coefficients = coefficients,
        StandardErrors = null,
        Residuals = [0.1, -0.3, 0.2],
        ResidualStandardDeviation = null,
        Count = 3,
    };

    [Fact]
    public void Evaluate_Quadratic_IsHornerOfTheCoefficients()
    {
        // Hand-worked: 1 + 2·3 + 0.5·3² = 11.5.
        Assert.Equal(11.5, Quadratic(1, 2, 0.5).Evaluate(3));
    }

    [Fact]
    public void DerivativeAt_Quadratic_IsSlopePlusTwiceCurvatureTimesX()
    {
        // Hand-worked: d/dx (1 + 2x + 0.5x²) = 2 + x → 5 at x = 3.
        Assert.Equal(5.0, Quadratic(1, 2, 0.5).DerivativeAt(3));
    }

    [Fact]
    public void MaxAbsResidual_IsLargestMagnitude()
    {
        Assert.Equal(0.3, Quadratic(1, 2, 0.5).MaxAbsResidual);
    }
}
