using LineTest.Core.Statistics;
using MathNetSf = MathNet.Numerics.SpecialFunctions;

namespace LineTest.Core.Tests.Statistics;

public sealed class SpecialFunctionsTests
{
    public static TheoryData<double> GammaArguments => new() { 1e-3, 0.1, 0.5, 1, 1.5, 2, 3.7, 10, 25.5, 100, 1000 };

    [Theory]
    [MemberData(nameof(GammaArguments))]
    public void LogGamma_GridOfArguments_MatchesMathNet(double x)
    {
        // MathNet.Numerics SpecialFunctions.GammaLn as independent reference.
        Assert.Equal(MathNetSf.GammaLn(x), SpecialFunctions.LogGamma(x), 1e-12 * Math.Max(1, Math.Abs(MathNetSf.GammaLn(x))));
    }

    [Fact]
    public void LogGamma_IntegersAndHalf_MatchFactorialsAndSqrtPi()
    {
        // Γ(n) = (n − 1)!, Γ(½) = √π [published identities].
        Assert.Equal(Math.Log(120), SpecialFunctions.LogGamma(6), 1e-13);
        Assert.Equal(0.5 * Math.Log(Math.PI), SpecialFunctions.LogGamma(0.5), 1e-13);
    }

    [Fact]
    public void GammaPAndQ_Grid_MatchMathNetAndSumToOne()
    {
        double[] shapes = [0.5, 1, 2.5, 5, 12, 50, 200];
        double[] xs = [0.01, 0.3, 1, 2.5, 5, 10, 20, 60, 250];
        foreach (var a in shapes)
        {
            foreach (var x in xs)
            {
                // MathNet.Numerics GammaLowerRegularized / GammaUpperRegularized as independent reference.
                var p = SpecialFunctions.GammaP(a, x);
                var q = SpecialFunctions.GammaQ(a, x);
                Assert.Equal(MathNetSf.GammaLowerRegularized(a, x), p, 1e-12);
                var expectedQ = MathNetSf.GammaUpperRegularized(a, x);
                Assert.True(Math.Abs(expectedQ - q) <= 1e-12 + (1e-10 * expectedQ), $"Q({a}, {x}) = {q}, MathNet {expectedQ}");
                Assert.Equal(1.0, p + q, 1e-14);
            }
        }
    }

    [Fact]
    public void BetaRegularized_Grid_MatchesMathNet()
    {
        double[] shapes = [0.5, 1, 2, 3.5, 10, 40, 150];
        double[] xs = [1e-4, 0.05, 0.2, 0.5, 0.8, 0.95, 0.9999];
        foreach (var a in shapes)
        {
            foreach (var b in shapes)
            {
                foreach (var x in xs)
                {
                    // MathNet.Numerics SpecialFunctions.BetaRegularized as independent reference.
                    var expected = MathNetSf.BetaRegularized(a, b, x);
                    var actual = SpecialFunctions.BetaRegularized(a, b, x);
                    Assert.True(Math.Abs(expected - actual) <= 1e-12, $"I_{x}({a}, {b}) = {actual}, MathNet {expected}");
                }
            }
        }
    }

    [Fact]
    public void BetaRegularized_OneOne_IsIdentity()
    {
        // I_x(1, 1) = x: the uniform distribution's CDF [published identity].
        Assert.Equal(0.37, SpecialFunctions.BetaRegularized(1, 1, 0.37), 1e-15);
    }

    [Fact]
    public void Arguments_OutOfDomain_Throw()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecialFunctions.LogGamma(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecialFunctions.GammaP(-1, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecialFunctions.GammaQ(1, -1));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecialFunctions.BetaRegularized(1, 1, 1.5));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpecialFunctions.BetaRegularized(0, 1, 0.5));
    }
}
