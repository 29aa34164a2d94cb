using LineTest.Reports.Building;
using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>
/// Individuals control chart: the values in run order, centre line, control limits, and the points of every
/// run-rule signal marked. Long series show their latest <see cref="MaxPoints"/> points only (the limits are
/// still those of all points), so a chart of a million runs stays readable and small.
/// </summary>
public static class IndividualsChartPlot
{
    /// <summary>Most points drawn.</summary>
    public const int MaxPoints = 2000;

    /// <summary>Draws the chart; null when the reading has no control chart.</summary>
    public static Plot? Create(ReadingStatistics reading)
    {
        ArgumentNullException.ThrowIfNull(reading);
        if (reading.Chart is not { } chart)
        {
            return null;
        }

        var all = reading.Values.Span;
        var first = Math.Max(0, all.Length - MaxPoints);
        var shown = all[first..];
        var xs = new double[shown.Length];
        var ys = shown.ToArray();
        for (var i = 0; i < xs.Length; i++)
        {
            xs[i] = first + i + 1;
        }

        var plot = new Plot();
        ChartImage.Style(plot);
        var data = plot.Add.Scatter(xs, ys);
        data.Color = ChartColors.Data;
        data.LineWidth = 1;
        data.MarkerSize = xs.Length > 300 ? 0 : 3;

        AddLevel(plot, chart.UpperControlLimit, ChartColors.Control, LinePattern.Dashed, "UCL");
        AddLevel(plot, chart.Centre, ChartColors.Centre, LinePattern.Solid, "X̄");
        AddLevel(plot, chart.LowerControlLimit, ChartColors.Control, LinePattern.Dashed, "LCL");

        var signalled = new SortedSet<int>();
        foreach (var signal in chart.Signals)
        {
            signalled.Add(signal.Index);
        }

        var mx = new List<double>();
        var my = new List<double>();
        foreach (var index in signalled)
        {
            if (index >= first)
            {
                mx.Add(index + 1);
                my.Add(all[index]);
            }
        }

        if (mx.Count > 0)
        {
            var markers = plot.Add.Markers(mx.ToArray(), my.ToArray(), MarkerShape.OpenCircle, 9, ChartColors.Signal);
            markers.MarkerLineWidth = 2;
            markers.LegendText = "Run-rule signal (rules under the chart)";
        }

        plot.ShowLegend(Alignment.UpperLeft);

        plot.Axes.Bottom.Label.Text = first > 0 ? $"Run (latest {MaxPoints:N0} of {all.Length:N0})" : "Run";
        plot.Axes.Left.Label.Text = string.IsNullOrEmpty(reading.Unit) ? reading.Name : reading.Unit;
        return plot;
    }

    private static void AddLevel(Plot plot, double y, Color color, LinePattern pattern, string label)
    {
        var line = plot.Add.HorizontalLine(y, 1.5f, color, pattern);

        // The value goes in the legend: three labels on lines a few pixels apart would overlap.
        line.LegendText = $"{label} {NumberText.Value(y)}";
    }
}
