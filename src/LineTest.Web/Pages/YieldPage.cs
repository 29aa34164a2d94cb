using System.Text;
using LineTest.Core.Statistics;
using LineTest.Reports.Building;
using LineTest.Reports.Loading;
using LineTest.Web.Live;

namespace LineTest.Web.Pages;

/// <summary>Yield: totals, by day and by shift, and the failure Pareto, for the runs the filters select.</summary>
internal static class YieldPage
{
    /// <summary>Yield of each shift that has runs, oldest first, from <see cref="YieldAnalysis"/> like every other yield.</summary>
    public static IReadOnlyList<(DateTimeOffset Start, YieldSummary Yield)> ByShift(RunTable runs, ShiftCalendar shifts)
    {
        var byStart = new SortedDictionary<DateTimeOffset, List<int>>();
        for (var r = 0; r < runs.Count; r++)
        {
            var start = shifts.ShiftOf(runs.EndedUtc(r)).Start;
            if (!byStart.TryGetValue(start, out var list))
            {
                byStart.Add(start, list = []);
            }

            list.Add(r);
        }

        return [.. byStart.Select(kv => (kv.Key, YieldAnalysis.Summarize(runs.Outcomes(kv.Value))))];
    }

    /// <summary>Says that the dates shown were chosen by the page, and how to see another window.</summary>
    public static string DefaultWindowNote(PageFilters filters) =>
        "<p class=\"note\">The last " + PageFilters.DefaultDays.ToString(System.Globalization.CultureInfo.InvariantCulture) + " days ("
        + Html.E(filters.From) + " to " + Html.E(filters.To) + ", UTC) unless other dates are chosen above.</p>";

    /// <summary>The page's main content.</summary>
    public static string Main(string form, QualityReport report, IReadOnlyList<(DateTimeOffset Start, YieldSummary Yield)> shifts, string chartQuery)
    {
        var y = report.Yield;
        var html = new StringBuilder(form);
        html.Append("<p class=\"lead\">").Append(Html.E(report.Query.Describe())).Append("</p>");
        html.Append("<table class=\"figures\"><tbody>");
        Html.Row(html, "Runs", NumberText.Count(y.Runs));
        Html.Row(html, "Units", NumberText.Count(y.Units));
        Html.Row(html, "Pass / fail / error runs", $"{NumberText.Count(y.PassRuns)} / {NumberText.Count(y.FailRuns)} / {NumberText.Count(y.ErrorRuns)}");
        Html.Row(html, "First-pass yield", Html.E(NumberText.Percent(y.FirstPassYield)));
        Html.Row(html, "Final yield", Html.E(NumberText.Percent(y.FinalYield)));
        Html.Row(html, "Retest rate", Html.E(NumberText.Percent(y.RetestRate)));
        html.Append("</tbody></table>");

        html.Append("<h2>By day</h2>");
        if (report.DailyYield.Count == 0)
        {
            html.Append(PageFrame.Notice("No runs."));
        }
        else
        {
            html.Append("<table><thead><tr><th>Day (UTC)</th><th>Runs</th><th>First-pass yield</th><th>Final yield</th></tr></thead><tbody>");
            foreach (var d in report.DailyYield)
            {
                html.Append("<tr><td>").Append(Html.E(d.Day)).Append("</td><td class=\"n\">").Append(NumberText.Count(d.Runs))
                    .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(d.FirstPassYield)))
                    .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(d.FinalYield))).Append("</td></tr>");
            }

            html.Append("</tbody></table>");
        }

        html.Append("<h2>By shift</h2>");
        if (shifts.Count > 0)
        {
            html.Append("<table><thead><tr><th>Shift from (UTC)</th><th>Runs</th><th>Units</th><th>First-pass yield</th><th>Final yield</th></tr></thead><tbody>");
            foreach (var (start, s) in shifts)
            {
                html.Append("<tr><td>").Append(Html.E(ShiftCalendar.Label(start))).Append("</td><td class=\"n\">").Append(NumberText.Count(s.Runs))
                    .Append("</td><td class=\"n\">").Append(NumberText.Count(s.Units))
                    .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(s.FirstPassYield)))
                    .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(s.FinalYield))).Append("</td></tr>");
            }

            html.Append("</tbody></table>");
        }

        html.Append("<h2>Failure Pareto</h2>");
        Pareto(html, y.FailurePareto, "Failing reading", "No failed run.");
        if (y.FailurePareto.Count > 0)
        {
            html.Append("<img class=\"chart\" src=\"/yield/pareto.svg").Append(chartQuery).Append("\" alt=\"Failure Pareto chart\" width=\"760\" height=\"300\">");
        }

        html.Append("<h2>Error reasons</h2>");
        Pareto(html, y.ErrorReasons, "Reason", "No run ended in error.");
        return html.ToString();
    }

    private static void Pareto(StringBuilder html, IReadOnlyList<ParetoEntry> entries, string what, string none)
    {
        if (entries.Count == 0)
        {
            html.Append(PageFrame.Notice(none));
            return;
        }

        html.Append("<table><thead><tr><th>").Append(Html.E(what)).Append("</th><th>Runs</th><th>Share</th><th>Cumulative</th></tr></thead><tbody>");
        foreach (var e in entries)
        {
            html.Append("<tr><td>").Append(Html.E(e.Name)).Append("</td><td class=\"n\">").Append(NumberText.Count(e.Count))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(e.Fraction)))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Percent(e.CumulativeFraction))).Append("</td></tr>");
        }

        html.Append("</tbody></table>");
    }
}
