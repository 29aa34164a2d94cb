using LineTest.Core.Statistics;
using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>Failed runs per failing reading, most frequent first, with the cumulative share on a right axis.</summary>
public static class ParetoChart
{
    /// <summary>Bars shown; the rest are summed into one "others" bar.</summary>
    public const int MaxBars = 12;

    /// <summary>Draws the chart.</summary>
    public static Plot Create(IReadOnlyList<ParetoEntry> bars)
    {
        ArgumentNullException.ThrowIfNull(bars);
        var plot = new Plot();
        ChartImage.Style(plot);
        var shown = bars.Take(MaxBars).Select(b => (b.Name, b.Count, b.CumulativeFraction)).ToList();
        if (bars.Count > MaxBars)
        {
            shown.Add(($"{bars.Count - MaxBars} others", bars.Skip(MaxBars).Sum(b => b.Count), 1.0));
        }

        var ticks = new List<Tick>();
        for (var i = 0; i < shown.Count; i++)
        {
            var bar = plot.Add.Bar(i, shown[i].Count);
            bar.Color = ChartColors.Bars;
            ticks.Add(new Tick(i, shown[i].Name));
        }

        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(ticks.ToArray());
        plot.Axes.Bottom.TickLabelStyle.Rotation = shown.Count > 4 ? -30 : 0;
        plot.Axes.Bottom.TickLabelStyle.Alignment = shown.Count > 4 ? Alignment.MiddleRight : Alignment.UpperCenter;
        plot.Axes.Left.Label.Text = "Failed runs";

        // Counts of runs are whole numbers: no 0.5 tick with a handful of failures.
        plot.Axes.Left.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { IntegerTicksOnly = true };
        plot.Axes.Margins(bottom: 0);

        var cumulative = plot.Add.Scatter(
            Enumerable.Range(0, shown.Count).Select(i => (double)i).ToArray(),
            shown.Select(s => s.CumulativeFraction * 100).ToArray());
        cumulative.Axes.YAxis = plot.Axes.Right;
        cumulative.Color = ChartColors.Fit;
        cumulative.LineWidth = 1.5f;
        cumulative.MarkerSize = 6;
        plot.Axes.Right.Label.Text = "Cumulative %";
        plot.Axes.SetLimitsY(0, 105, plot.Axes.Right);
        plot.Axes.SetLimitsY(0, Math.Max(1, shown.Count == 0 ? 1 : shown.Max(s => s.Count)) * 1.1, plot.Axes.Left);
        plot.Axes.SetLimitsX(-0.6, Math.Max(0.6, shown.Count - 0.4));
        return plot;
    }
}
