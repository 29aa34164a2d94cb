using LineTest.Reports.Building;
using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>Histogram of a reading with its limits, its mean and the normal curve fitted by mean and overall σ.</summary>
public static class HistogramChart
{
    /// <summary>Draws the chart; null when the reading has no values.</summary>
    public static Plot? Create(ReadingStatistics reading)
    {
        ArgumentNullException.ThrowIfNull(reading);
        var values = reading.Values.Span;
        if (values.Length == 0)
        {
            return null;
        }

        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        foreach (var v in values)
        {
            min = Math.Min(min, v);
            max = Math.Max(max, v);
        }

        // The axis spans the data and both limits, so a capable process shows its distance to the limits.
        var low = Math.Min(min, reading.Low ?? min);
        var high = Math.Max(max, reading.High ?? max);
        if (!(high > low))
        {
            low -= 0.5;
            high += 0.5;
        }

        var bins = (int)Math.Clamp(Math.Ceiling(Math.Sqrt(values.Length)), 8, 60);
        var span = high - low;
        var histogram = ScottPlot.Statistics.Histogram.WithBinCount(bins, low - (span * 0.02), high + (span * 0.02));
        foreach (var v in values)
        {
            histogram.Add(v);
        }

        var plot = new Plot();
        ChartImage.Style(plot);
        var bars = plot.Add.Histogram(histogram);
        foreach (var bar in bars.Bars)
        {
            bar.FillColor = ChartColors.Bars.WithAlpha(0.75);
            bar.LineColor = Colors.White;
        }

        if (reading.Capability is { Mean: { } mean, StdDevOverall: { } sigma } && sigma > 0)
        {
            var scale = values.Length * histogram.FirstBinSize;
            var curve = plot.Add.Function(x => scale * Density((x - mean) / sigma) / sigma);
            curve.LineColor = ChartColors.Fit;
            curve.LineWidth = 2;
            curve.LegendText = "Normal fit";
            var meanLine = plot.Add.VerticalLine(mean, 1.5f, ChartColors.Centre, LinePattern.Dotted);
            meanLine.LegendText = "Mean";
        }

        AddLimit(plot, reading.Low, "LSL");
        AddLimit(plot, reading.High, "USL");
        plot.Axes.Left.Label.Text = "Count";
        plot.Axes.Bottom.Label.Text = string.IsNullOrEmpty(reading.Unit) ? reading.Name : $"{reading.Name} ({reading.Unit})";
        plot.Axes.Margins(bottom: 0);
        return plot;
    }

    // Standard normal density φ(z) = exp(−z²/2)/√(2π).
    private static double Density(double z) => Math.Exp(-0.5 * z * z) / Math.Sqrt(2 * Math.PI);

    private static void AddLimit(Plot plot, double? limit, string label)
    {
        if (limit is not { } x)
        {
            return;
        }

        var line = plot.Add.VerticalLine(x, 2, ChartColors.Limit, LinePattern.Dashed);
        line.Text = label;
        line.LabelOppositeAxis = true;
        line.LabelBackgroundColor = ChartColors.Limit;
    }
}
