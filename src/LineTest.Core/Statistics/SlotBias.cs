using System.Runtime.CompilerServices;

namespace LineTest.Core.Statistics;

/// <summary>Slot-bias check: one-way ANOVA of values grouped by slot, p-value from the F upper tail.</summary>
public static class SlotBias
{
    /// <summary>
    /// Analyses values by slot. <paramref name="slots"/>[i] is the slot of <paramref name="values"/>[i].
    /// Slots with no values simply do not appear. Two passes over the data (means, then squared deviations)
    /// so a large common offset does not cancel digits; O(N) plus a sort of the slot numbers.
    /// </summary>
    public static StatisticOutcome<SlotBiasResult> Analyze(ReadOnlySpan<int> slots, ReadOnlySpan<double> values)
    {
        if (slots.Length != values.Length)
        {
            throw new ArgumentException($"slots has {slots.Length} entries but values has {values.Length}; they must pair up one to one.", nameof(slots));
        }

        // Squares of deviations beyond about 1e154 overflow. The F ratio does not depend on the scale, so very large
        // values are analysed divided by a power of two (exact) and the means scaled back.
        double largest = 0;
        foreach (var v in values)
        {
            largest = Math.Max(largest, Math.Abs(v));
        }

        if (double.IsFinite(largest) && largest > LargeValue)
        {
            var scale = Math.ScaleB(1.0, Math.ILogB(largest));
            var scaled = new double[values.Length];
            for (var i = 0; i < scaled.Length; i++)
            {
                scaled[i] = values[i] / scale;
            }

            var outcome = AnalyzeUnscaled(slots, scaled);
            if (outcome.Value is not { } r)
            {
                return outcome;
            }

            return StatisticOutcome<SlotBiasResult>.Computed(r with
            {
                GrandMean = r.GrandMean * scale,
                SumOfSquaresBetween = r.SumOfSquaresBetween * scale * scale,
                SumOfSquaresWithin = r.SumOfSquaresWithin * scale * scale,
                Groups = r.Groups.Select(g => g with { Mean = g.Mean * scale, OffsetFromGrandMean = g.OffsetFromGrandMean * scale }).ToList(),
            });
        }

        return AnalyzeUnscaled(slots, values);
    }

    /// <summary>Above this magnitude values are scaled before squaring.</summary>
    private const double LargeValue = 1e100;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static StatisticOutcome<SlotBiasResult> AnalyzeUnscaled(ReadOnlySpan<int> slots, ReadOnlySpan<double> values)
    {

        var index = new Dictionary<int, int>();
        var counts = new List<int>();
        var sums = new List<double>();
        double total = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var v = values[i];
            if (!double.IsFinite(v))
            {
                throw new ArgumentException($"values[{i}] (slot {slots[i]}) is {v}; remove missing readings first.", nameof(values));
            }

            if (!index.TryGetValue(slots[i], out var g))
            {
                g = counts.Count;
                index.Add(slots[i], g);
                counts.Add(0);
                sums.Add(0);
            }

            counts[g]++;
            sums[g] += v;
            total += v;
        }

        var k = counts.Count;
        var n = values.Length;
        if (k < 2)
        {
            return StatisticOutcome<SlotBiasResult>.NotComputed(
                $"A slot comparison needs values from at least 2 slots; got {k}.");
        }

        if (n - k < 1)
        {
            return StatisticOutcome<SlotBiasResult>.NotComputed(
                "Every slot has a single value: there is no within-slot spread to compare against.");
        }

        var means = new double[k];
        for (var g = 0; g < k; g++)
        {
            means[g] = sums[g] / counts[g];
        }

        var grandMean = total / n;
        double ssWithin = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var d = values[i] - means[index[slots[i]]];
            ssWithin += d * d;
        }

        double ssBetween = 0;
        for (var g = 0; g < k; g++)
        {
            var d = means[g] - grandMean;
            ssBetween += counts[g] * d * d;
        }

        if (!(ssWithin > 0))
        {
            return StatisticOutcome<SlotBiasResult>.NotComputed(
                "No spread within any slot (each slot's values are identical): the F ratio is undefined.");
        }

        var dfBetween = k - 1;
        var dfWithin = n - k;
        var f = ssBetween / dfBetween / (ssWithin / dfWithin);
        var p = FDistribution.UpperTail(dfBetween, dfWithin, f);

        var groups = new List<SlotGroup>(k);
        foreach (var (slot, g) in index)
        {
            groups.Add(new SlotGroup(slot, counts[g], means[g], means[g] - grandMean));
        }

        groups.Sort((a, b) => a.Slot.CompareTo(b.Slot));
        return StatisticOutcome<SlotBiasResult>.Computed(
            new SlotBiasResult(grandMean, ssBetween, ssWithin, dfBetween, dfWithin, f, p, groups));
    }
}
