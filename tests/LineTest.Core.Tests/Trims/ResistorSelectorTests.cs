using CsCheck;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class ResistorSelectorTests
{
    [Fact]
    public void Choose_NoPairs_GivesNearestSeriesValue()
    {
        var choice = ResistorSelector.Choose("R7", 9382.716, ESeries.E96, allowPairs: false, 1000, 100_000);

        Assert.Equal(ResistorConnection.Single, choice.Connection);
        Assert.Equal([9310.0], choice.Parts);
        Assert.Equal("Fit 9.31 kΩ (E96) in position R7", choice.Instruction);
    }

    [Fact]
    public void Choose_E24WithPairs_FindsTwelveKParallelFortyThreeK()
    {
        // Hand-worked for R* = 9382.716 Ω: single E24 9.1 kΩ is 3.1 % off. Parallel with R1 = 12 kΩ needs
        // R2 = 1/(1/9382.716 − 1/12000) = 43 019 Ω → 43 kΩ; 12k·43k/55k = 9381.82 Ω, 0.0096 % off, the best
        // of every E24 pair between 1 Ω and 100 MΩ (checked by brute force).
        var choice = ResistorSelector.Choose("R7", 9382.716, ESeries.E24, allowPairs: true, 1000, 100_000);

        Assert.Equal(ResistorConnection.Parallel, choice.Connection);
        Assert.Equal([43000.0, 12000.0], choice.Parts);
        Assert.Equal(9381.818181818, choice.EffectiveOhms, 6);
        Assert.Equal("Fit 43 kΩ and 12 kΩ (E24) in parallel in position R7", choice.Instruction);
    }

    [Fact]
    public void Choose_ExactSeriesValue_StaysSingleEvenWithPairs()
    {
        var choice = ResistorSelector.Choose("R8", 4700, ESeries.E24, allowPairs: true, 10, 1e6);

        Assert.Equal(ResistorConnection.Single, choice.Connection);
        Assert.Equal([4700.0], choice.Parts);
    }

    [Fact]
    public void Choose_NearestOutsideRange_PicksNearestInsideRange()
    {
        // 9.9 kΩ's nearest E24 value is 10 kΩ, but the position allows at most 9.5 kΩ → 9.1 kΩ.
        var choice = ResistorSelector.Choose("R7", 9400, ESeries.E24, allowPairs: false, 1000, 9500);

        Assert.Equal([9100.0], choice.Parts);
    }

    [Fact]
    public void Choose_RandomIdeals_AsGoodAsBruteForce()
    {
        // Brute force over every E12 pair in 10 Ω…10 MΩ as an independent check of the search.
        var parts = ESeries.E12.ValuesBetween(10, 1e7);
        Gen.Double[100, 100_000].Sample(ideal =>
        {
            var choice = ResistorSelector.Choose("R1", ideal, ESeries.E12, allowPairs: true, 10, 1e7);
            var bestSingle = parts.Min(p => Math.Abs(Math.Log(p / ideal)));
            var bestPair = parts.SelectMany(p => parts.Select(q => (p, q)))
                .Min(t => Math.Min(
                    Math.Abs(Math.Log((t.p + t.q) / ideal)),
                    Math.Abs(Math.Log((t.p * t.q / (t.p + t.q)) / ideal))));
            var chosen = Math.Abs(Math.Log(choice.EffectiveOhms / ideal));

            Assert.True(chosen <= bestSingle + 1e-12, $"chosen {chosen} worse than best single {bestSingle}");
            if (bestPair < ResistorSelector.PairImprovementFactor * bestSingle)
            {
                // A pair is worth it: the search must find one at least as good as brute force's.
                Assert.NotEqual(ResistorConnection.Single, choice.Connection);
                Assert.True(chosen <= bestPair + 1e-12, $"chosen {chosen}, brute-force pair {bestPair}");
            }
        }, iter: 60);
    }
}
