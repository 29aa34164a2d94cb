using ScottPlot;

namespace LineTest.Web.Charts;

/// <summary>
/// A chart of LineTest.Reports drawn as SVG for the page. Each chart is its own document behind an img element, so
/// the element ids inside one chart cannot clash with another's.
/// </summary>
public static class SvgChart
{
    /// <summary>Chart width in CSS pixels.</summary>
    public const int Width = 760;

    /// <summary>Chart height in CSS pixels.</summary>
    public const int Height = 300;

    /// <summary>The SVG text of <paramref name="plot"/> at the page's size (scale 1: SVG is sharp at any size).</summary>
    public static string Render(Plot plot)
    {
        ArgumentNullException.ThrowIfNull(plot);
        plot.ScaleFactor = 1;
        return plot.GetSvgXml(Width, Height);
    }
}
