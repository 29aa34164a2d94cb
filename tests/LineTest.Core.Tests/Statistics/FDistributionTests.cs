using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class FDistributionTests
{
    [Fact]
    public void CdfAndUpperTail_Grid_MatchMathNetFisherSnedecor()
    {
        double[] d1s = [1, 2, 3, 5, 10, 30];
        double[] d2s = [1, 2, 6, 12, 40, 200, 5000];
        double[] xs = [0.05, 0.3, 0.9, 1.5, 3, 7, 25];
        foreach (var d1 in d1s)
        {
            foreach (var d2 in d2s)
            {
                foreach (var x in xs)
                {
                    // MathNet.Numerics FisherSnedecor.CDF as independent reference.
                    var expected = FisherSnedecor.CDF(d1, d2, x);
                    Assert.True(Math.Abs(expected - FDistribution.Cdf(d1, d2, x)) <= 1e-11, $"F({d1}, {d2}) CDF at {x}");
                    Assert.True(Math.Abs((1 - expected) - FDistribution.UpperTail(d1, d2, x)) <= 1e-11, $"F({d1}, {d2}) tail at {x}");
                }
            }
        }
    }

    [Fact]
    public void UpperTail_TwoNumeratorDegrees_MatchesClosedForm()
    {
        // For d1 = 2: P(F > x) = (1 + 2x/d2)^(−d2/2) [derived from the F density].
        Assert.Equal(Math.Pow(1 + (2 * 4.0 / 9), -4.5), FDistribution.UpperTail(2, 9, 4.0), 1e-14);
    }

    [Fact]
    public void UpperTail_FiveDegreesCriticalValue_IsFivePercent()
    {
        // F table, α = 0.05, (3, 20) → 3.10 [published].
        Assert.Equal(0.05, FDistribution.UpperTail(3, 20, 3.098), 5e-4);
    }

    [Fact]
    public void Cdf_ZeroDegrees_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => FDistribution.Cdf(0, 3, 1));
    }
}
