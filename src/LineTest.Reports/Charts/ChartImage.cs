using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>
/// Turns a ScottPlot chart into an embedded PNG. PNG rather than SVG: the fonts are baked into the pixels, so
/// the page looks the same on a machine without the fonts the chart was drawn with, and several charts cannot
/// clash over SVG element ids in one page.
/// </summary>
public static class ChartImage
{
    /// <summary>Pixels per layout pixel: sharp on high-density screens and in print.</summary>
    public const float Scale = 2f;

    /// <summary>Font family for chart text (Debian package fonts-dejavu-core).</summary>
    public const string FontName = "DejaVu Sans";

    /// <summary>Applies the common look: font, white background, light grid.</summary>
    public static void Style(Plot plot)
    {
        ArgumentNullException.ThrowIfNull(plot);
        plot.Font.Set(FontName);
        plot.ScaleFactor = Scale;
        plot.FigureBackground.Color = Colors.White;
        plot.DataBackground.Color = Colors.White;
        plot.Grid.MajorLineColor = Colors.Black.WithAlpha(0.08);
    }

    /// <summary>PNG bytes of <paramref name="plot"/> at <paramref name="width"/> × <paramref name="height"/> layout pixels.</summary>
    public static byte[] Png(Plot plot, int width, int height)
    {
        ArgumentNullException.ThrowIfNull(plot);
        return plot.GetImageBytes((int)(width * Scale), (int)(height * Scale), ImageFormat.Png);
    }

    /// <summary>A data: URI with the PNG, for an img element that needs no file and no network.</summary>
    public static string PngDataUri(Plot plot, int width, int height) =>
        "data:image/png;base64," + Convert.ToBase64String(Png(plot, width, height));
}
