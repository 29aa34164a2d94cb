using LineTest.Core.Stability;

namespace LineTest.Core.Tests.Stability;

public sealed class ResidualRunsTests
{
    [Fact]
    public void Test_TwoBlocksOfFive_GivesHandComputedZ()
    {
        // [derived] NIST/SEMATECH e-Handbook §1.3.5.13 formulas by hand: n₁ = n₂ = 5, N = 10, R = 2,
        // mean 2·25/10 + 1 = 6, variance 2·25·(50 − 10)/(100·9) = 2.2222, z = (2 − 6)/1.49071 = −2.68328.
        double[] residuals = [1, 1, 1, 1, 1, -1, -1, -1, -1, -1];

        var (runs, z) = ResidualRuns.Test(residuals, 0);

        Assert.Equal(2, runs);
        Assert.Equal(-2.68328, z, 1e-5);
    }

    [Fact]
    public void Test_RunsEqualToTheirExpectation_GivesZeroZ()
    {
        // [derived] n₁ = n₂ = 3: mean runs 2·9/6 + 1 = 4; four runs give z = 0.
        double[] residuals = [0.2, 0.1, -0.3, -0.1, 0.4, -0.2];

        var (runs, z) = ResidualRuns.Test(residuals, 0);

        Assert.Equal(4, runs);
        Assert.Equal(0, z, 1e-12);
    }

    [Fact]
    public void Test_Alternating_GivesPositiveZ()
    {
        double[] residuals = [1, -1, 1, -1, 1, -1, 1, -1];

        var (runs, z) = ResidualRuns.Test(residuals, 0);

        Assert.Equal(8, runs);
        Assert.True(z > 2);
    }

    [Fact]
    public void Test_ResidualsWithinTolerance_AreIgnored()
    {
        double[] residuals = [1e-9, -1e-9, 1e-9, -1e-9];

        var (runs, z) = ResidualRuns.Test(residuals, 1e-6);

        Assert.Equal(0, runs);
        Assert.Equal(0, z);
    }
}
