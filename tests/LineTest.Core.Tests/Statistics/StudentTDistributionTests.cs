using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class StudentTDistributionTests
{
    [Fact]
    public void Cdf_Grid_MatchesMathNet()
    {
        double[] dfs = [1, 2, 5, 19, 100];
        double[] ts = [-6, -2.5, -1, -0.2, 0, 0.7, 2.093, 4];
        foreach (var df in dfs)
        {
            foreach (var t in ts)
            {
                // MathNet.Numerics StudentT.CDF as independent reference.
                Assert.Equal(StudentT.CDF(0, 1, df, t), StudentTDistribution.Cdf(df, t), 1e-12);
            }
        }
    }

    [Fact]
    public void Cdf_TableCriticalValue_Is975()
    {
        // t table: t(0.975, 19) = 2.093 [published].
        Assert.Equal(0.975, StudentTDistribution.Cdf(19, 2.093), 1e-4);
    }
}
