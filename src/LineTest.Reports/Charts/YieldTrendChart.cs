using LineTest.Reports.Building;
using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>First-pass and final yield per UTC day.</summary>
public static class YieldTrendChart
{
    /// <summary>Draws the chart; null with fewer than two days (no trend to show).</summary>
    public static Plot? Create(IReadOnlyList<DailyYield> days)
    {
        ArgumentNullException.ThrowIfNull(days);
        if (days.Count < 2)
        {
            return null;
        }

        var plot = new Plot();
        ChartImage.Style(plot);
        var xs = Enumerable.Range(0, days.Count).Select(i => (double)i).ToArray();
        var fpy = plot.Add.Scatter(xs, days.Select(d => (d.FirstPassYield ?? double.NaN) * 100).ToArray());
        fpy.LegendText = "First-pass yield";
        fpy.Color = ChartColors.Data;
        fpy.LineWidth = 2;
        var final = plot.Add.Scatter(xs, days.Select(d => (d.FinalYield ?? double.NaN) * 100).ToArray());
        final.LegendText = "Final yield";
        final.Color = ChartColors.Control;
        final.LineWidth = 2;
        final.LinePattern = LinePattern.Dashed;
        var step = Math.Max(1, days.Count / 10);
        var ticks = Enumerable.Range(0, days.Count).Where(i => i % step == 0).Select(i => new Tick(i, days[i].Day)).ToArray();
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(ticks);
        plot.Axes.Left.Label.Text = "Yield %";
        var lowest = days.Min(d => Math.Min(d.FirstPassYield ?? 1, d.FinalYield ?? 1)) * 100;
        plot.Axes.SetLimitsY(Math.Max(0, Math.Floor((lowest - 5) / 5) * 5), 101);
        plot.ShowLegend(Alignment.LowerLeft);
        return plot;
    }
}
