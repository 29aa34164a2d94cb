using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

public sealed class GaussianRandomTests
{
    [Fact]
    public void NextNormal_ManyDraws_MeanAndSpreadAsAsked()
    {
        var random = new Random(12);
        var draws = Enumerable.Range(0, 50_000).Select(_ => random.NextNormal(3, 0.5)).ToArray();

        // Standard error of the mean 0.5/√50000 ≈ 0.0022; of the SD ≈ 0.5/√100000 ≈ 0.0016.
        var mean = draws.Average();
        var sd = Math.Sqrt(draws.Sum(d => (d - mean) * (d - mean)) / (draws.Length - 1));
        Assert.Equal(3, mean, 0.01);
        Assert.Equal(0.5, sd, 0.008);

        // Normal distribution: 68.27 % within ±1σ [published, standard normal table].
        var withinOneSigma = draws.Count(d => Math.Abs(d - 3) <= 0.5) / (double)draws.Length;
        Assert.Equal(0.6827, withinOneSigma, 0.006);
    }

    [Fact]
    public void NextTruncatedNormal_ManyDraws_StayInsideBounds()
    {
        var random = new Random(4);

        Assert.All(Enumerable.Range(0, 10_000).Select(_ => random.NextTruncatedNormal(0, 1, -0.5, 2)), d => Assert.InRange(d, -0.5, 2));
    }

    [Fact]
    public void NextLogNormal_ManyDraws_PositiveWithMedianAsAsked()
    {
        var random = new Random(9);
        var draws = Enumerable.Range(0, 20_001).Select(_ => random.NextLogNormal(2e-15, 0.3)).Order().ToArray();

        Assert.All(draws, d => Assert.True(d > 0));
        Assert.Equal(2e-15, draws[10_000], 0.05e-15);
    }

    [Fact]
    public void NextStandardNormal_SameSeed_SameSequence()
    {
        var a = new Random(31);
        var b = new Random(31);

        Assert.Equal(Enumerable.Range(0, 100).Select(_ => a.NextStandardNormal()), Enumerable.Range(0, 100).Select(_ => b.NextStandardNormal()));
    }
}
