namespace LineTest.Core.Decisions;

/// <summary>A trimmed unit's predicted error over its rated range (<see cref="RatedRangeBudget"/>).</summary>
/// <param name="LowC">Low end of the rated range, °C.</param>
/// <param name="HighC">High end, °C.</param>
/// <param name="Grid">The prediction at each temperature of the grid, in increasing temperature.</param>
public sealed record RatedRangePrediction(double LowC, double HighC, IReadOnlyList<RatedRangePoint> Grid)
{
    /// <summary>The grid point of largest |predicted error|.</summary>
    public RatedRangePoint Worst => Grid.MaxBy(p => Math.Abs(p.ErrorC))!;

    /// <summary>Largest |predicted error| over the range, °C.</summary>
    public double MaxAbsErrorC => Math.Abs(Worst.ErrorC);

    /// <summary>Expanded uncertainty of the error at the worst point, with k from its ν_eff.</summary>
    public ExpandedUncertainty WorstUncertainty => new(Worst.StandardUncertaintyC, CoverageFactor.ForDegreesOfFreedom(Worst.EffectiveDegreesOfFreedom))
    {
        EffectiveDegreesOfFreedom = Worst.EffectiveDegreesOfFreedom,
    };

    /// <summary>Root mean square of the predicted error over the grid, °C.</summary>
    public double RmsErrorC => Math.Sqrt(Grid.Average(p => p.ErrorC * p.ErrorC));

    /// <summary>Root mean square of the standard uncertainty over the grid, °C (the spread about the prediction).</summary>
    public double RmsUncertaintyC => Math.Sqrt(Grid.Average(p => p.StandardUncertaintyC * p.StandardUncertaintyC));

    /// <summary>
    /// Expanded uncertainty of <see cref="RmsErrorC"/>: u = <see cref="RmsUncertaintyC"/>, k from the smallest ν_eff of the grid.
    /// </summary>
    public ExpandedUncertainty RmsUncertainty
    {
        get
        {
            var nu = Grid.Select(p => p.EffectiveDegreesOfFreedom).Where(v => v is not null).Select(v => v!.Value).DefaultIfEmpty(double.PositiveInfinity).Min();
            double? dof = double.IsPositiveInfinity(nu) ? null : nu;
            return new ExpandedUncertainty(RmsUncertaintyC, CoverageFactor.ForDegreesOfFreedom(dof)) { EffectiveDegreesOfFreedom = dof };
        }
    }

    /// <summary>
    /// The irreducible floor of the population: root mean square over the grid of the standard uncertainty with the
    /// trim's resolution, °C. A unit whose predicted error is zero everywhere is expected to show this RMS error.
    /// </summary>
    public double FloorRmsC => Math.Sqrt(Grid.Average(p => p.FloorC * p.FloorC));

    /// <summary>The grid point nearest <paramref name="celsius"/>.</summary>
    public RatedRangePoint Nearest(double celsius) => Grid.MinBy(p => Math.Abs(p.Celsius - celsius))!;

}
