using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class IndividualsChartTests
{
    [Fact]
    public void Compute_HandExample_GivesLimits()
    {
        // 1, 3, 2, 4, 3: x̄ 2.6, moving ranges 2, 1, 2, 1 → MR̄ 1.5 [hand-computed];
        // limits x̄ ± 2.66·MR̄, MR upper limit 3.267·MR̄, σ̂ = MR̄/1.128 (SPC handbooks, ASTM E2587) [published].
        var chart = IndividualsChart.Compute([1.0, 3, 2, 4, 3]).Value!;
        Assert.Equal(5, chart.Count);
        Assert.Equal(2.6, chart.Centre, 1e-12);
        Assert.Equal(1.5, chart.AverageMovingRange, 1e-12);
        Assert.Equal(2.6 + 3.99, chart.UpperControlLimit, 1e-12);
        Assert.Equal(2.6 - 3.99, chart.LowerControlLimit, 1e-12);
        Assert.Equal(4.9005, chart.MovingRangeUpperLimit, 1e-12);
        Assert.Equal(1.5 / 1.128, chart.SigmaWithin, 1e-12);
        Assert.Empty(chart.MovingRangesAboveLimit);
        Assert.Empty(chart.Signals);
    }

    [Fact]
    public void Compute_BigJump_FlagsMovingRangeAndPoint()
    {
        // Twenty points alternating 10 ± 0.1 (MR 0.2 each) and one jump to 14.
        var values = Enumerable.Range(0, 20).Select(i => 10 + (i % 2 == 0 ? -0.1 : 0.1)).ToList();
        values.Insert(10, 14);
        var chart = IndividualsChart.Compute(values.ToArray()).Value!;
        Assert.Equal([10, 11], chart.MovingRangesAboveLimit);
        Assert.Contains(chart.Signals, s => s.Family == RunRuleFamily.Nelson && s.Rule == 1 && s.Points.SequenceEqual([10]));
    }

    [Fact]
    public void Compute_ZonesAreThirdsOfLimitDistance()
    {
        // A drifting sequence with signals; the chart's run rules use σ = (UCL − x̄)/3 so the zones and the
        // plotted limits agree.
        var values = Enumerable.Range(0, 60).Select(i => Math.Sin(i * 0.7) + (i > 40 ? 1.5 : 0)).ToArray();
        var chart = IndividualsChart.Compute(values).Value!;
        var expected = RunRules.Evaluate(values, chart.Centre, (chart.UpperControlLimit - chart.Centre) / 3);
        Assert.NotEmpty(chart.Signals);
        Assert.Equal(expected.Count, chart.Signals.Count);
        Assert.All(chart.Signals.Zip(expected), p => Assert.Equal(p.Second.Points, p.First.Points));
    }

    [Fact]
    public void Compute_OnePoint_NotComputed()
    {
        var outcome = IndividualsChart.Compute([1.0]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("at least 2", outcome.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Compute_AllEqual_NotComputed()
    {
        var outcome = IndividualsChart.Compute([2.0, 2.0, 2.0]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("zero", outcome.Reason, StringComparison.Ordinal);
    }

    // Regression (report fuzzing, a readings CSV with a value of -1.797E308 beside ordinary ones): the moving range
    // overflowed to infinity and the run rules threw instead of the chart being reported as not computed.
    [Fact]
    public void Compute_ValuesWhoseMovingRangeOverflows_NotComputedNoThrow()
    {
        var outcome = IndividualsChart.Compute([2.5, -1.7976931348623157e308, 2.6, 2.45]);
        Assert.False(outcome.IsComputed);
        Assert.Contains("not finite", outcome.Reason, StringComparison.Ordinal);
    }
}
