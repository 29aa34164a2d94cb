using ScottPlot;

namespace LineTest.Reports.Charts;

/// <summary>The report's palette, chosen to stay distinct when printed in grey.</summary>
internal static class ChartColors
{
    public static readonly Color Data = Color.FromHex("#2F6690");
    public static readonly Color Fit = Color.FromHex("#1B1B1B");
    public static readonly Color Limit = Color.FromHex("#C0392B");
    public static readonly Color Control = Color.FromHex("#D68910");
    public static readonly Color Centre = Color.FromHex("#5D6D7E");
    public static readonly Color Signal = Color.FromHex("#C0392B");
    public static readonly Color Bars = Color.FromHex("#3A7CA5");
}
