using System.Globalization;
using System.Text;
using LineTest.Core.Statistics;
using LineTest.Reports.Building;

namespace LineTest.Web.Pages;

/// <summary>
/// Capability per product and reading, from the same <see cref="ReportBuilder"/> as <c>report</c>: an overview of
/// every reading, and one reading with its statistics, histogram, individuals chart and run-rule signals.
/// </summary>
internal static class CapabilityPage
{
    /// <summary>Most signals listed one by one; the rest are counted.</summary>
    public const int MaxSignalsListed = 200;

    /// <summary>Every reading of the report in one table, each linking to its own page.</summary>
    public static string Overview(string form, QualityReport report, string filterQuery)
    {
        var html = new StringBuilder(form);
        html.Append("<p class=\"lead\">").Append(Html.E(report.Query.Describe())).Append("</p>");
        if (report.Readings.Count == 0)
        {
            html.Append(PageFrame.Notice("No readings in the selected runs."));
            return html.ToString();
        }

        html.Append("<table><thead><tr><th>Reading</th><th>Unit</th><th>n</th><th>Mean</th><th>σ within</th><th>Cpk</th><th>Ppk</th><th>Signals</th></tr></thead><tbody>");
        foreach (var r in report.Readings)
        {
            var c = r.Capability;
            var link = "/capability/reading" + filterQuery + (filterQuery.Length == 0 ? "?" : "&amp;") + "reading=" + Html.E(Html.U(r.Name));
            html.Append("<tr><td><a href=\"").Append(link).Append("\">").Append(Html.E(r.Name)).Append("</a></td><td>").Append(Html.E(r.Unit))
                .Append("</td><td class=\"n\">").Append(NumberText.Count(r.Count))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Value(c.Mean)))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Value(c.StdDevWithin)))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Index(c.Cpk)))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Index(c.Ppk)))
                .Append("</td><td>").Append(Html.E(r.Chart is { } chart ? SignalLabels.Summary(chart.Signals) : r.ChartNote)).Append("</td></tr>");
        }

        html.Append("</tbody></table>");
        return html.ToString();
    }

    /// <summary>One reading: statistics, charts, signals.</summary>
    public static string Reading(string form, QualityReport report, ReadingStatistics r, string chartQuery)
    {
        var c = r.Capability;
        var html = new StringBuilder(form);
        html.Append("<p class=\"lead\">").Append(Html.E(report.Query.Describe())).Append("</p>");
        html.Append("<table class=\"figures\"><tbody>");
        Html.Row(html, "Unit", Html.E(r.Unit));
        Html.Row(html, "Limits", Html.E($"{NumberText.Value(r.Low)} … {NumberText.Value(r.High)}") + (r.LimitsChanged ? " <em>(limits or unit changed within the data; the latest are used)</em>" : string.Empty));
        Html.Row(html, "n", Html.E(NumberText.Count(c.Count)) + (r.Missing > 0 ? Html.E($" ({NumberText.Count(r.Missing)} without a value left out)") : string.Empty));
        Html.Row(html, "Mean", Html.E(NumberText.Value(c.Mean)));
        Html.Row(html, "σ overall", Html.E(NumberText.Value(c.StdDevOverall)));
        Html.Row(html, "σ within (MR̄/d₂)", Html.E(NumberText.Value(c.StdDevWithin)));
        Html.Row(html, "Cp", Index(c.Cp, c.CpInterval));
        Html.Row(html, "Cpk", Index(c.Cpk, c.CpkInterval));
        Html.Row(html, "Pp", Index(c.Pp, c.PpInterval));
        Html.Row(html, "Ppk", Index(c.Ppk, c.PpkInterval));
        Html.Row(html, "Out of spec, observed", Html.E(NumberText.Ppm(c.ObservedPpmTotal) + " ppm"));
        Html.Row(html, "Out of spec, expected", Html.E(NumberText.Ppm(c.ExpectedPpmTotal) + " ppm"));
        Html.Row(html, "Normality (Anderson–Darling)", r.Normality is { } ad
            ? Html.E(string.Create(CultureInfo.InvariantCulture, $"A²* = {ad.AStarSquared:F3}, p = {NumberText.P(ad.PValue)}"))
            : Html.E(r.NormalityNote));
        html.Append("</tbody></table>");
        foreach (var note in c.Notes)
        {
            html.Append(PageFrame.Notice(note));
        }

        html.Append("<h2>Histogram</h2>");
        if (r.Count > 0)
        {
            html.Append("<img class=\"chart\" src=\"/capability/histogram.svg").Append(chartQuery).Append("\" alt=\"Histogram of ")
                .Append(Html.E(r.Name)).Append(" with its limits\" width=\"760\" height=\"300\">");
        }
        else
        {
            html.Append(PageFrame.Notice("No values."));
        }

        html.Append("<h2>Individuals chart</h2>");
        if (r.Chart is { } chart)
        {
            html.Append("<img class=\"chart\" src=\"/capability/individuals.svg").Append(chartQuery).Append("\" alt=\"Individuals chart of ")
                .Append(Html.E(r.Name)).Append("\" width=\"760\" height=\"300\">");
            html.Append("<p>Centre ").Append(Html.E(NumberText.Value(chart.Centre))).Append(", control limits ")
                .Append(Html.E(NumberText.Value(chart.LowerControlLimit))).Append(" … ").Append(Html.E(NumberText.Value(chart.UpperControlLimit))).Append(".</p>");
            Signals(html, chart);
        }
        else
        {
            html.Append(PageFrame.Notice(r.ChartNote ?? "No control chart."));
        }

        return html.ToString();
    }

    private static void Signals(StringBuilder html, IndividualsChartResult chart)
    {
        html.Append("<h2>Signals</h2>");
        if (chart.Signals.Count == 0)
        {
            html.Append("<p class=\"signals-none\">No run-rule signal.</p>");
            return;
        }

        html.Append("<p>").Append(Html.E(SignalLabels.Summary(chart.Signals))).Append("</p><table class=\"signals\"><thead><tr><th>Rule</th><th>At point</th><th>What</th></tr></thead><tbody>");
        foreach (var s in chart.Signals.Take(MaxSignalsListed))
        {
            html.Append("<tr><td>").Append(Html.E(SignalLabels.Label(s))).Append("</td><td class=\"n\">")
                .Append((s.Index + 1).ToString(CultureInfo.InvariantCulture)).Append("</td><td>").Append(Html.E(s.Description)).Append("</td></tr>");
        }

        html.Append("</tbody></table>");
        if (chart.Signals.Count > MaxSignalsListed)
        {
            html.Append(PageFrame.Notice($"{chart.Signals.Count - MaxSignalsListed} more signals not listed."));
        }
    }

    private static string Index(double? value, ConfidenceInterval? interval) =>
        Html.E(NumberText.Index(value)) + (interval is { } i
            ? Html.E(string.Create(CultureInfo.InvariantCulture, $" ({i.Level * 100:F0} % bounds {NumberText.Index(i.Lower)} … {NumberText.Index(i.Upper)})"))
            : string.Empty);
}
