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

        // Bins cover the data only (so a capable process still shows its shape); the axis also spans the limits.
        var bins = (int)Math.Clamp(Math.Ceiling(Math.Sqrt(values.Length)), 8, 60);
        var dataSpan = max > min ? max - min : Math.Max(Math.Abs(min) * 1e-3, 1e-9);
        var binSize = dataSpan / bins;
        var histogram = ScottPlot.Statistics.Histogram.WithBinSize(binSize, min - (binSize / 2), max + (binSize / 2));
        var span = high - low;
        var left = Math.Min(low, min - binSize) - (span * 0.04);
        var right = Math.Max(high, max + binSize) + (span * 0.04);
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

        var top = (double)Math.Max(1, histogram.Counts.Max());
        if (reading.Capability is { Mean: { } mean, StdDevOverall: { } sigma } && sigma > 0)
        {
            var scale = values.Length * histogram.FirstBinSize;
            var curve = plot.Add.Function(x => scale * Density((x - mean) / sigma) / sigma);
            curve.LineColor = ChartColors.Fit;
            curve.LineWidth = 2;
            curve.LegendText = "Normal fit";
            top = Math.Max(top, scale * Density(0) / sigma);
            var meanLine = plot.Add.VerticalLine(mean, 1.5f, ChartColors.Centre, LinePattern.Dotted);
            meanLine.LegendText = "Mean";
        }

        top *= 1.15;
        AddLimit(plot, reading.Low, "LSL", top);
        AddLimit(plot, reading.High, "USL", top);
        plot.Axes.Left.Label.Text = "Count";
        plot.Axes.Bottom.Label.Text = string.IsNullOrEmpty(reading.Unit) ? reading.Name : $"{reading.Name} ({reading.Unit})";
        // Fixed axes: the fitted curve is a function of unlimited extent and must not widen the view.
        plot.Axes.SetLimitsX(left, right);
        plot.Axes.SetLimitsY(0, top);
        return plot;
    }

    // Standard normal density φ(z) = exp(−z²/2)/√(2π).
    private static double Density(double z) => Math.Exp(-0.5 * z * z) / Math.Sqrt(2 * Math.PI);

    private static void AddLimit(Plot plot, double? limit, string label, double top)
    {
        if (limit is not { } x)
        {
            return;
        }

        plot.Add.VerticalLine(x, 2, ChartColors.Limit, LinePattern.Dashed);

        // Labels inside the data area: a line's own label sits outside it and is cut off at the figure edge.
        var text = plot.Add.Text(label, x, top);
        text.LabelFontColor = ChartColors.Limit;
        text.LabelBold = true;
        text.LabelFontSize = 12;
        // LSL to the right of its line, USL to the left, so neither runs off the plot.
        var isUpper = label == "USL";
        text.LabelAlignment = isUpper ? Alignment.UpperRight : Alignment.UpperLeft;
        text.OffsetX = isUpper ? -4 : 4;
        text.OffsetY = 2;
    }
}
