using System.Globalization;
using LineTest.Core.Statistics;
using LineTest.Reports.Charts;
using LineTest.Reports.Html;

namespace LineTest.Reports.Tests.Charts;

public sealed class ParetoChartTests
{
    public static TheoryData<int[]> FewFailures => new()
    {
        new[] { 1 },
        new[] { 2, 1 },
        new[] { 3, 2, 1, 1 },
        new[] { 7, 4, 2, 1, 1, 1 },
    };

    // Regression: with a handful of failed runs the count axis was labelled 0, 0.5, 1, 1.5 … although a count of
    // failed runs is a whole number.
    [Theory]
    [MemberData(nameof(FewFailures))]
    public void Create_FewFailedRuns_CountAxisHasWholeNumberTicksOnly(int[] counts)
    {
        var total = counts.Sum();
        var cumulative = 0;
        var bars = counts.Select((c, i) =>
        {
            cumulative += c;
            return new ParetoEntry($"reading.{i}", c, (double)c / total, (double)cumulative / total);
        }).ToList();
        var plot = ParetoChart.Create(bars);

        _ = ChartImage.Png(plot, HtmlReportWriter.ChartWidth, HtmlReportWriter.ChartHeight);

        var labelled = plot.Axes.Left.TickGenerator.Ticks.Where(t => t.IsMajor && !string.IsNullOrEmpty(t.Label)).ToList();
        Assert.True(labelled.Count >= 2, $"only {labelled.Count} labelled ticks on the count axis");
        foreach (var tick in labelled)
        {
            Assert.True(tick.Position == Math.Round(tick.Position), $"tick at {tick.Position.ToString(CultureInfo.InvariantCulture)} ('{tick.Label}') is not a whole number");
            Assert.True(int.TryParse(tick.Label, NumberStyles.Integer, CultureInfo.InvariantCulture, out _), $"tick label '{tick.Label}' is not a whole number");
        }

        // The highest bar is still inside the axis.
        Assert.True(plot.Axes.Left.Range.Max >= counts.Max());
    }
}
