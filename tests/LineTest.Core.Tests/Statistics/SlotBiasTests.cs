using CsCheck;
using LineTest.Core.Statistics;
using MathNet.Numerics.Distributions;

namespace LineTest.Core.Tests.Statistics;

public sealed class SlotBiasTests
{
    [Fact]
    public void Analyze_TextbookExample_GivesFAndP()
    {
        // Slot 1: 4, 5, 6; slot 2: 6, 7, 8; slot 3: 8, 9, 10 [hand-computed, textbook layout]:
        // grand mean 7, SSB = 3·(4 + 0 + 4) = 24, SSW = 2 + 2 + 2 = 6, df 2 and 6, F = 12/1 = 12,
        // p = P(F(2, 6) > 12) = (1 + 2·12/6)^(−3) = 1/125 = 0.008 [derived closed form for d1 = 2].
        int[] slots = [1, 1, 1, 2, 2, 2, 3, 3, 3];
        double[] values = [4, 5, 6, 6, 7, 8, 8, 9, 10];
        var r = SlotBias.Analyze(slots, values).Value!;
        Assert.Equal(7.0, r.GrandMean, 1e-12);
        Assert.Equal(24.0, r.SumOfSquaresBetween, 1e-12);
        Assert.Equal(6.0, r.SumOfSquaresWithin, 1e-12);
        Assert.Equal(2, r.DegreesOfFreedomBetween);
        Assert.Equal(6, r.DegreesOfFreedomWithin);
        Assert.Equal(12.0, r.FStatistic, 1e-12);
        Assert.Equal(0.008, r.PValue, 1e-14);

        // MathNet.Numerics FisherSnedecor.CDF as independent reference for the p-value.
        Assert.Equal(1 - FisherSnedecor.CDF(2, 6, 12), r.PValue, 1e-12);

        Assert.Equal([1, 2, 3], r.Groups.Select(g => g.Slot));
        Assert.Equal([-2.0, 0, 2], r.Groups.Select(g => g.OffsetFromGrandMean));
        Assert.All(r.Groups, g => Assert.Equal(3, g.Count));
    }

    [Fact]
    public void Analyze_UnequalGroupsInAnyOrder_MatchesMathNet()
    {
        // Unbalanced groups, interleaved; F from the definitions, p from MathNet's FisherSnedecor.
        int[] slots = [4, 2, 4, 1, 2, 4, 1, 2, 4, 4];
        double[] values = [10.2, 9.9, 10.4, 10.0, 10.1, 10.3, 9.8, 9.7, 10.6, 10.1];
        var r = SlotBias.Analyze(slots, values).Value!;

        var groups = slots.Zip(values).GroupBy(p => p.First).ToArray();
        var grand = values.Average();
        var ssb = groups.Sum(g => g.Count() * Math.Pow(g.Average(p => p.Second) - grand, 2));
        var ssw = groups.Sum(g => g.Sum(p => Math.Pow(p.Second - g.Average(q => q.Second), 2)));
        var f = ssb / 2 / (ssw / 7);
        Assert.Equal(f, r.FStatistic, 1e-10);
        Assert.Equal(1 - FisherSnedecor.CDF(2, 7, f), r.PValue, 1e-12);
        Assert.Equal([1, 2, 4], r.Groups.Select(g => g.Slot));
        Assert.Equal([2, 3, 5], r.Groups.Select(g => g.Count));
    }

    [Fact]
    public void Analyze_OneSlot_NotComputedWithReason()
    {
        var outcome = SlotBias.Analyze([1, 1, 1], [1.0, 2, 3]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("at least 2 slots", outcome.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Analyze_OneValuePerSlot_NotComputed()
    {
        Assert.False(SlotBias.Analyze([1, 2, 3], [1.0, 2, 3]).IsComputed);
    }

    [Fact]
    public void Analyze_NoSpreadWithinSlots_NotComputed()
    {
        var outcome = SlotBias.Analyze([1, 1, 2, 2], [1.0, 1, 2, 2]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("No spread within", outcome.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Analyze_LengthMismatch_Throws()
    {
        Assert.Throws<ArgumentException>(() => SlotBias.Analyze([1, 2], [1.0]));
    }

    [Fact]
    public void Analyze_Property_OrderDoesNotMatterAndShiftDoesNotChangeF()
    {
        var gen = Gen.Select(Gen.Int[1, 4], Gen.Double[-5, 5]).Array[6, 40];
        // Shifts stay moderate: a shift of 1e4 on values of ±5 leaves only ~11 significant digits for the
        // within-slot sum of squares, and nearly-equal groups then give an F that differs in the 6th digit.
        Gen.Select(gen, Gen.Double[-100, 100]).Sample(t =>
        {
            var (pairs, shift) = t;
            var slots = pairs.Select(p => p.Item1).ToArray();
            var values = pairs.Select(p => p.Item2).ToArray();
            var a = SlotBias.Analyze(slots, values);
            var b = SlotBias.Analyze(slots.Reverse().ToArray(), values.Reverse().Select(v => v + shift).ToArray());
            // Degenerate draws (CsCheck favours repeated values): with no spread inside the slots the within sum of
            // squares is zero or rounding noise, which a shift can tip either way (a group mean of equal values is
            // not always exactly that value). Order and shift invariance is only a property of real spread.
            if (!a.IsComputed || !b.IsComputed || a.Value!.FStatistic > 1e6)
            {
                return a.IsComputed || !b.IsComputed || b.Value!.FStatistic > 1e6;
            }

            var fa = a.Value!.FStatistic;
            var fb = b.Value!.FStatistic;
            return a.Value.PValue is >= 0 and <= 1 && Math.Abs(fa - fb) <= 1e-6 * Math.Max(1, fa);
        });
    }

    [Fact]
    public void Analyze_ValuesOf1e160_GiveTheSameFAsScaledValues()
    {
        // F is scale-invariant, so values ×1e160 must give the F of the small values (regression: 1e160 crashed reports).
        int[] slots = [1, 1, 1, 2, 2, 2, 3, 3, 3];
        double[] small = [4, 5, 6, 6, 7, 8, 8, 9, 10];
        var a = SlotBias.Analyze(slots, small).Value!;
        var b = SlotBias.Analyze(slots, small.Select(v => v * 1e160).ToArray()).Value!;
        Assert.Equal(a.FStatistic, b.FStatistic, 1e-9 * a.FStatistic);
        Assert.Equal(a.PValue, b.PValue, 1e-12);
        Assert.Equal(a.GrandMean * 1e160, b.GrandMean, 1e-9 * b.GrandMean);
    }
}
