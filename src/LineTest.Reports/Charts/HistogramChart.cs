using LineTest.Core.Statistics;
using LineTest.Reports.Building;
using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>
/// Histogram of a reading with its limits, its mean and the normal curve fitted by mean and overall σ. The bins span
/// the bulk of the data (outliers such as failed units' readings would otherwise squeeze every good unit into one
/// bar); values beyond the bins are counted in the outermost bars and said so in the legend.
/// </summary>
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

        var (from, to) = BinRange(values);
        var bins = (int)Math.Clamp(Math.Ceiling(Math.Sqrt(values.Length)), 8, 60);
        var width = (to - from) / bins;
        var counts = new double[bins];
        int below = 0, above = 0;
        foreach (var v in values)
        {
            var bin = (int)Math.Floor((v - from) / width);
            if (bin < 0)
            {
                below += v < from ? 1 : 0;
                bin = 0;
            }
            else if (bin >= bins)
            {
                above += v > to ? 1 : 0;
                bin = bins - 1;
            }

            counts[bin]++;
        }

        var plot = new Plot();
        ChartImage.Style(plot);
        var bars = new List<Bar>(bins);
        for (var b = 0; b < bins; b++)
        {
            bars.Add(new Bar
            {
                Position = from + ((b + 0.5) * width),
                Value = counts[b],
                Size = width,
                FillColor = ChartColors.Bars.WithAlpha(0.75),
                LineColor = Colors.White,
            });
        }

        plot.Add.Bars(bars);
        var top = Math.Max(1, counts.Max());
        if (reading.Capability is { Mean: { } mean, StdDevOverall: { } sigma } && sigma > 0)
        {
            var scale = values.Length * width;
            var curve = plot.Add.Function(x => scale * Density((x - mean) / sigma) / sigma);
            curve.LineColor = ChartColors.Fit;
            curve.LineWidth = 2;
            curve.LegendText = "Normal fit";
            top = Math.Max(top, scale * Density(0) / sigma);
            var meanLine = plot.Add.VerticalLine(mean, 1.5f, ChartColors.Centre, LinePattern.Dotted);
            meanLine.LegendText = $"Mean {NumberText.Value(mean)}";
        }

        // Limit labels go in the legend, where two close limits cannot overlap.
        AddLimit(plot, reading.Low, "LSL");
        AddLimit(plot, reading.High, "USL");
        if (below + above > 0)
        {
            var edge = plot.Add.Marker(from, 0, MarkerShape.None);
            var parts = new List<string>(2);
            if (below > 0)
            {
                parts.Add($"{below} below {NumberText.Value(from)}");
            }

            if (above > 0)
            {
                parts.Add($"{above} above {NumberText.Value(to)}");
            }

            edge.LegendText = $"{string.Join(" and ", parts)} counted in the end bar{(parts.Count > 1 ? "s" : string.Empty)}";
        }

        // The axis spans the bins and the limits, so a capable process shows its distance to the limits.
        var left = Math.Min(from, reading.Low ?? from);
        var right = Math.Max(to, reading.High ?? to);
        var margin = (right - left) * 0.04;
        plot.Axes.Left.Label.Text = "Count";
        plot.Axes.Bottom.Label.Text = string.IsNullOrEmpty(reading.Unit) ? reading.Name : $"{reading.Name} ({reading.Unit})";
        plot.ShowLegend(Alignment.UpperRight);
        // Fixed axes: the fitted curve is a function of unlimited extent and must not widen the view.
        if (!double.IsFinite(left - margin) || !double.IsFinite(right + margin) || !(width > 0) || !double.IsFinite(width))
        {
            // Values near ±1.8E308: the axis itself would overflow, so there is no histogram to draw.
            return null;
        }

        plot.Axes.SetLimitsX(left - margin, right + margin);
        plot.Axes.SetLimitsY(0, top * 1.35);
        return plot;
    }

    /// <summary>
    /// The span the bins cover: the data between Tukey's far-out fences (quartiles ∓ 3 interquartile ranges), or all
    /// of it when that is narrower; never empty.
    /// </summary>
    public static (double From, double To) BinRange(ReadOnlySpan<double> values)
    {
        if (values.IsEmpty)
        {
            throw new ArgumentException("A histogram needs at least one value.", nameof(values));
        }

        var sorted = values.ToArray();
        Array.Sort(sorted);
        var q1 = PercentileCapability.Quantile(sorted, 0.25);
        var q3 = PercentileCapability.Quantile(sorted, 0.75);
        var iqr = q3 - q1;
        var from = sorted[0];
        var to = sorted[^1];
        if (iqr > 0 && double.IsFinite(iqr * 3))
        {
            from = Math.Max(from, q1 - (3 * iqr));
            to = Math.Min(to, q3 + (3 * iqr));
        }

        if (!(to > from) || !double.IsFinite(to - from))
        {
            // One distinct value (or a span too wide to subtract): a narrow window around the middle.
            var centre = (from / 2) + (to / 2);
            var half = Math.Max(Math.Abs(centre) * 1e-3, 1e-9);
            if (double.IsFinite(to - from) && to > from)
            {
                half = (to - from) / 2;
            }

            from = centre - half;
            to = centre + half;
        }

        return (from, to);
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
        line.LegendText = $"{label} {NumberText.Value(x)}";
    }
}
