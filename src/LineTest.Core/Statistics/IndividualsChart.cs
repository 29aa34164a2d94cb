namespace LineTest.Core.Statistics;

/// <summary>
/// Individuals and moving-range control chart (limits x̄ ± 2.66·MR̄, MR upper limit 3.267·MR̄; ASTM E2587
/// and the usual SPC handbooks), with Western Electric and Nelson run rules.
/// </summary>
public static class IndividualsChart
{
    /// <summary>E2 = 3/d2 for a moving range of span 2, as tabled (3/1.128 rounded to 2.66).</summary>
    public const double E2 = 2.66;

    /// <summary>D4 for subgroup size 2: MR chart upper limit factor.</summary>
    public const double MovingRangeD4 = 3.267;

    /// <summary>
    /// Builds the chart from points in time order. The run-rule zones are thirds of the distance from the
    /// centre line to the control limits (σ = 2.66·MR̄/3), so rule 1 and the plotted limits agree exactly.
    /// </summary>
    public static StatisticOutcome<IndividualsChartResult> Compute(ReadOnlySpan<double> values)
    {
        if (values.Length < 2)
        {
            return StatisticOutcome<IndividualsChartResult>.NotComputed(
                $"An individuals chart needs at least 2 points for a moving range; got {values.Length}.");
        }

        var mean = Descriptive.Mean(values);
        var mrBar = Descriptive.AverageMovingRange(values);
        if (!(mrBar > 0))
        {
            return StatisticOutcome<IndividualsChartResult>.NotComputed(
                "The average moving range is zero (all points equal): control limits would collapse onto the centre line.");
        }

        // Values near ±1.8E308 overflow the moving ranges (or the mean): no limits or zones can be drawn from them.
        if (!double.IsFinite(mrBar) || !double.IsFinite(mean) || !double.IsFinite(MovingRangeD4 * mrBar))
        {
            return StatisticOutcome<IndividualsChartResult>.NotComputed(
                "The mean or the average moving range is not finite (values too large for double arithmetic): no control limits.");
        }

        var mrLimit = MovingRangeD4 * mrBar;
        var above = new List<int>();
        for (var i = 1; i < values.Length; i++)
        {
            if (Math.Abs(values[i] - values[i - 1]) > mrLimit)
            {
                above.Add(i);
            }
        }

        var halfWidth = E2 * mrBar;
        return StatisticOutcome<IndividualsChartResult>.Computed(new IndividualsChartResult
        {
            Count = values.Length,
            Centre = mean,
            AverageMovingRange = mrBar,
            SigmaWithin = mrBar / Capability.MovingRangeD2,
            UpperControlLimit = mean + halfWidth,
            LowerControlLimit = mean - halfWidth,
            MovingRangeUpperLimit = mrLimit,
            MovingRangesAboveLimit = above,
            Signals = RunRules.Evaluate(values, mean, halfWidth / 3),
        });
    }
}
