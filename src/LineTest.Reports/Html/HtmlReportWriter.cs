using System.Globalization;
using System.Net;
using System.Text;
using LineTest.Reports.Building;
using LineTest.Reports.Charts;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Html;

/// <summary>
/// Writes a report as one self-contained HTML page: inline CSS, charts as embedded PNG (drawn with ScottPlot),
/// no script and no reference to anything outside the file. Laid out for screen and for A4 print (each reading's
/// section is kept on one page).
/// </summary>
public static class HtmlReportWriter
{
    /// <summary>Chart width and height in CSS pixels (drawn at twice that for sharp print).</summary>
    public const int ChartWidth = 760;

    /// <summary>Chart height in CSS pixels.</summary>
    public const int ChartHeight = 280;

    /// <summary>Writes the page to <paramref name="writer"/>.</summary>
    public static void Write(QualityReport report, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(writer);
        var h = new StringBuilder();
        h.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        h.Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        h.Append("<title>").Append(E(report.Title)).Append("</title>\n<style>\n").Append(Css).Append("</style>\n</head>\n<body>\n<main>\n");
        Header(h, report);
        Summary(h, report);
        Failures(h, report);
        Trend(h, report);
        Overview(h, report);
        var label = ReportText.Labeller(report);
        foreach (var (reading, i) in report.Readings.Select((r, i) => (r, i)))
        {
            ReadingSection(h, reading, report.Slots[i], i + 1, label(reading));
        }

        Groups(h, report);
        h.Append("<footer>Capability: Cp, Cpk from the within σ (average moving range / 1.128, run order); Pp, Ppk and expected ppm from the overall σ. ")
            .Append("95 % bounds: chi-square on Cp, Bissell (1990) on Cpk, with the effective degrees of freedom of the moving-range σ (about 0.6(n − 1)). ")
            .Append("Normality: Anderson–Darling A*² with its p-value; ! marks p < 0.05, where Ppk pct (ISO 22514-2 percentile method) is the figure to read. ")
            .Append("Run rules: WE1–WE4 Western Electric (1956), N1–N8 Nelson (1984): ")
            .Append(E(string.Join("; ", SignalLabels.Legend.Select(l => $"{l.Label} {l.Rule}"))))
            .Append(". A dash marks a value that is not defined.</footer>\n");
        h.Append("</main>\n</body>\n</html>\n");
        writer.Write(h.ToString());
    }

    /// <summary>The page as a string.</summary>
    public static string ToHtml(QualityReport report)
    {
        using var writer = new StringWriter(CultureInfo.InvariantCulture);
        Write(report, writer);
        return writer.ToString();
    }

    private const string Css = """
        :root { --ink: #1d2733; --muted: #5b6675; --line: #d5dbe3; --accent: #2f6690; --bad: #b03a2e; --good: #1e7b4f; }
        * { box-sizing: border-box; }
        body { margin: 0; background: #f4f6f8; color: var(--ink); font: 14px/1.45 "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; }
        main { max-width: 960px; margin: 0 auto; padding: 24px 28px 40px; background: #fff; }
        h1 { font-size: 24px; margin: 0 0 4px; color: var(--accent); }
        h2 { font-size: 18px; margin: 28px 0 10px; padding-bottom: 4px; border-bottom: 2px solid var(--accent); }
        h3 { font-size: 16px; margin: 0 0 8px; }
        .meta { color: var(--muted); margin: 0; font-size: 13px; }
        .meta b { color: var(--ink); font-weight: 600; }
        .tiles { display: grid; grid-template-columns: repeat(3, 1fr); gap: 10px; margin-top: 12px; }
        .tile { border: 1px solid var(--line); border-radius: 6px; padding: 10px 12px; }
        .tile .v { font-size: 22px; font-weight: 700; }
        .tile .k { color: var(--muted); font-size: 12px; text-transform: uppercase; letter-spacing: .04em; }
        table { border-collapse: collapse; width: 100%; margin: 8px 0 4px; font-size: 12.5px; }
        th, td { padding: 4px 5px; border-bottom: 1px solid var(--line); text-align: right; white-space: nowrap; }
        th:first-child, td:first-child { text-align: left; white-space: normal; }
        th { background: #eef2f6; font-weight: 600; white-space: normal; vertical-align: bottom; }
        td.covers { white-space: normal; font-size: 11px; min-width: 9.5em; }
        .covers, th.sig { text-align: left; }
        .wide { max-width: 100%; overflow-x: auto; }
        td.low { color: var(--bad); font-weight: 600; }
        .bad { color: var(--bad); }
        td.sig { white-space: normal; text-align: left; font-size: 11px; min-width: 9em; }
        figure { margin: 10px 0; }
        figure img { display: block; width: 100%; max-width: 100%; height: auto; border: 1px solid var(--line); border-radius: 4px; }
        figcaption { color: var(--muted); font-size: 12px; margin-top: 3px; }
        .reading { border-top: 1px solid var(--line); padding-top: 16px; margin-top: 22px; break-inside: avoid; page-break-inside: avoid; }
        .figures dl { display: grid; grid-template-columns: repeat(3, auto 1fr); gap: 2px 10px; margin: 0 0 6px; font-size: 12.5px; }
        dt { color: var(--muted); } dd { margin: 0; font-weight: 600; }
        .notes { color: var(--muted); font-size: 12px; margin: 4px 0 0; padding-left: 18px; }
        .empty { color: var(--muted); font-style: italic; }
        footer { margin-top: 30px; padding-top: 8px; border-top: 1px solid var(--line); color: var(--muted); font-size: 11.5px; }
        @page { size: A4; margin: 14mm 12mm; }
        @media print {
          body { background: #fff; font-size: 10.5pt; }
          main { max-width: none; padding: 0; }
          h2 { break-after: avoid; page-break-after: avoid; }
          table { font-size: 9pt; }
          th, td { padding: 3px 3px; }
          td.covers, td.sig { font-size: 7.5pt; }
          .wide { overflow: visible; }
          figure img { max-width: 100%; border: none; }
          .reading, .tiles, figure, table { break-inside: avoid; page-break-inside: avoid; }
        }

        """;

    private static void Header(StringBuilder h, QualityReport report)
    {
        h.Append("<header>\n<h1>").Append(E(report.Title)).Append("</h1>\n");
        h.Append("<p class=\"meta\"><b>Runs:</b> ").Append(E(report.Query.Describe()));
        if (report.Query.GroupBy != ReportGrouping.None)
        {
            h.Append(" · <b>grouped by</b> ").Append(E(report.Query.GroupBy.ToString().ToLowerInvariant()));
        }

        h.Append("</p>\n<p class=\"meta\"><b>Made:</b> ")
            .Append(E(report.GeneratedUtc.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture))).Append(" UTC · <b>from</b> ")
            .Append(E(string.Join(", ", report.Sources))).Append("</p>\n");
        if (report.SkippedRows.Count > 0)
        {
            h.Append("<p class=\"meta\"><b>Skipped ").Append(NumberText.Count(report.SkippedRows.Count)).Append(" bad input row(s):</b> ")
                .Append(E(string.Join("; ", report.SkippedRows.Take(50)))).Append(report.SkippedRows.Count > 50 ? " …" : string.Empty).Append("</p>\n");
        }

        h.Append("</header>\n");
    }

    private static void Summary(StringBuilder h, QualityReport report)
    {
        var y = report.Yield;
        h.Append("<h2>Yield</h2>\n<div class=\"tiles\">\n");
        Tile(h, "First-pass yield", NumberText.Percent(y.FirstPassYield));
        Tile(h, "Final yield", NumberText.Percent(y.FinalYield));
        Tile(h, "Units / runs", $"{NumberText.Count(y.Units)} / {NumberText.Count(y.Runs)}");
        Tile(h, "Retests per unit", NumberText.Rate(y.RetestRate));
        Tile(h, "Runs in error", NumberText.Percent(y.ErrorRate));
        Tile(h, "Pass / fail / error runs", $"{NumberText.Count(y.PassRuns)} / {NumberText.Count(y.FailRuns)} / {NumberText.Count(y.ErrorRuns)}");
        h.Append("</div>\n");
    }

    private static void Tile(StringBuilder h, string key, string value) =>
        h.Append("<div class=\"tile\"><div class=\"k\">").Append(E(key)).Append("</div><div class=\"v\">").Append(E(value)).Append("</div></div>\n");

    private static void Failures(StringBuilder h, QualityReport report)
    {
        var y = report.Yield;
        h.Append("<h2>Failures</h2>\n");
        if (y.FailurePareto.Count == 0)
        {
            h.Append("<p class=\"empty\">No failed runs.</p>\n");
        }
        else
        {
            Figure(h, ChartImage.PngDataUri(ParetoChart.Create(y.FailurePareto), ChartWidth, ChartHeight), "Pareto of failed runs by first failing reading", "Failed runs by first failing reading, with the cumulative share.");
        }

        if (y.ErrorReasons.Count > 0)
        {
            h.Append("<table>\n<tr><th>Runs in error: reason</th><th>Runs</th></tr>\n");
            foreach (var bar in y.ErrorReasons)
            {
                h.Append("<tr><td>").Append(E(bar.Name)).Append("</td><td>").Append(NumberText.Count(bar.Count)).Append("</td></tr>\n");
            }

            h.Append("</table>\n");
        }
    }

    private static void Trend(StringBuilder h, QualityReport report)
    {
        if (YieldTrendChart.Create(report.DailyYield) is { } plot)
        {
            h.Append("<h2>Yield by day</h2>\n");
            Figure(h, ChartImage.PngDataUri(plot, ChartWidth, 240), "Yield trend by day", "First-pass and final yield of the units tested each UTC day.");
        }
    }

    private static void Overview(StringBuilder h, QualityReport report)
    {
        h.Append("<h2>Readings</h2>\n");
        if (report.Readings.Count == 0)
        {
            h.Append("<p class=\"empty\">No readings match the filters.</p>\n");
            return;
        }

        var label = ReportText.Labeller(report);
        // Twelve columns in a 960 px column (186 mm in print): headings and the text columns wrap, reading names break
        // after their dots, numbers never; on a narrower screen the table scrolls inside its box, not the page.
        h.Append("<div class=\"wide\"><table>\n<tr><th>Reading</th><th class=\"covers\">Covers</th><th>n</th><th>Mean</th><th>SD overall</th><th>Cpk</th><th>Cpk 95 %</th><th>Ppk</th><th>Ppk pct</th><th>ppm obs</th><th>ppm exp</th><th class=\"sig\">Signals</th></tr>\n");
        foreach (var r in report.Readings)
        {
            var c = r.Capability;
            var format = ReportText.ValueFormat(r);
            h.Append("<tr><td>").Append(Breakable(label(r))).Append(string.IsNullOrEmpty(r.Unit) ? string.Empty : $" <small>({E(r.Unit)})</small>")
                .Append(r.NonNormal ? " <b class=\"bad\" title=\"not normal: Anderson–Darling p &lt; 0.05\">!</b>" : string.Empty).Append("</td>");
            h.Append("<td class=\"covers\">").Append(E(r.Covers)).Append("</td>");
            Cell(h, NumberText.Count(r.Count));
            Cell(h, format(c.Mean));
            Cell(h, format(c.StdDevOverall));
            Cell(h, NumberText.Index(c.Cpk), c.Cpk < 1.33);
            Cell(h, c.CpkInterval is { } ci ? $"{NumberText.Index(ci.Lower)}–{NumberText.Index(ci.Upper)}" : NumberText.NotDefined);
            Cell(h, NumberText.Index(c.Ppk), c.Ppk < 1.33);
            Cell(h, NumberText.Index(r.Percentile?.Ppk), r.Percentile?.Ppk < 1.33);
            Cell(h, NumberText.Ppm(c.ObservedPpmTotal));
            Cell(h, NumberText.Ppm(c.ExpectedPpmTotal));
            h.Append("<td class=\"sig\">").Append(E(r.Chart is { } chart ? SignalLabels.Summary(chart.Signals) : NumberText.NotDefined)).Append("</td>");
            h.Append("</tr>\n");
        }

        h.Append("</table></div>\n<p class=\"meta\">Indices below 1.33, a usual minimum for an established process, are shown in red. ");
        foreach (var note in ReportText.CapabilityNotes(report))
        {
            h.Append(E(note)).Append(' ');
        }

        h.Append("</p>\n");
    }

    private static void ReadingSection(StringBuilder h, ReadingStatistics r, SlotBiasEntry slots, int number, string name)
    {
        var c = r.Capability;
        var format = ReportText.ValueFormat(r);
        h.Append("<section class=\"reading\">\n<h3>").Append(number.ToString(CultureInfo.InvariantCulture)).Append(". ").Append(E(name));
        if (!string.IsNullOrEmpty(r.Unit))
        {
            h.Append(" <small>(").Append(E(r.Unit)).Append(")</small>");
        }

        h.Append("</h3>\n<p class=\"meta\">Covers ").Append(E(r.Covers)).Append(r.NonNormal ? " · <b class=\"bad\">! not normal (Anderson–Darling p &lt; 0.05): read Ppk pct</b>" : string.Empty).Append("</p>\n<div class=\"figures\"><dl>\n");
        Pair(h, "Limits", $"{NumberText.Value(r.Low)} … {NumberText.Value(r.High)}");
        Pair(h, "n", NumberText.Count(r.Count) + (r.Missing > 0 ? $" (+{NumberText.Count(r.Missing)} missing)" : string.Empty));
        Pair(h, "Mean", format(c.Mean));
        Pair(h, "SD overall / within", $"{format(c.StdDevOverall)} / {format(c.StdDevWithin)}");
        Pair(h, "Cp", c.CpInterval is { } cpi ? $"{NumberText.Index(c.Cp)} ({NumberText.Index(cpi.Lower)}–{NumberText.Index(cpi.Upper)})" : NumberText.Index(c.Cp));
        Pair(h, "Cpk", c.CpkInterval is { } cki ? $"{NumberText.Index(c.Cpk)} ({NumberText.Index(cki.Lower)}–{NumberText.Index(cki.Upper)})" : NumberText.Index(c.Cpk));
        Pair(h, "Pp / Ppk", $"{NumberText.Index(c.Pp)} / {NumberText.Index(c.Ppk)}");
        Pair(h, "Pp / Ppk pct", r.Percentile is { } pct ? $"{NumberText.Index(pct.Pp)} / {NumberText.Index(pct.Ppk)}" : NumberText.NotDefined);
        Pair(h, "ppm obs / exp", $"{NumberText.Ppm(c.ObservedPpmTotal)} / {NumberText.Ppm(c.ExpectedPpmTotal)}");
        Pair(h, "A*² / p", r.Normality is { } ad ? $"{NumberText.Value(ad.AStarSquared)} / {NumberText.P(ad.PValue)}" : NumberText.NotDefined);
        Pair(h, "Slot bias F / p", slots.Result is { } s ? $"{NumberText.Value(s.FStatistic)} / {NumberText.P(s.PValue)}" : NumberText.NotDefined);
        Pair(h, "UCL / LCL", r.Chart is { } ch ? $"{format(ch.UpperControlLimit)} / {format(ch.LowerControlLimit)}" : NumberText.NotDefined);
        Pair(h, "Signals", r.Chart is { } chs ? SignalLabels.Summary(chs.Signals) : NumberText.NotDefined);
        h.Append("</dl></div>\n");

        if (HistogramChart.Create(r) is { } histogram)
        {
            Figure(h, ChartImage.PngDataUri(histogram, ChartWidth, ChartHeight), $"Histogram of {name}", "Histogram with the specification limits (dashed), the mean (dotted) and the fitted normal curve; bars span the bulk of the data, values beyond them are counted in the end bars.");
        }

        if (IndividualsChartPlot.Create(r) is { } control)
        {
            Figure(h, ChartImage.PngDataUri(control, ChartWidth, ChartHeight), $"Individuals chart of {name}", "Individuals chart in run order with control limits X̄ ± 2.66·MR̄; circled points end a run-rule pattern.");
        }

        if (slots.Result is { } bias)
        {
            h.Append("<table>\n<tr><th>Slot</th><th>n</th><th>Mean</th><th>Offset from overall mean</th></tr>\n");
            foreach (var g in bias.Groups)
            {
                h.Append("<tr><td>").Append(g.Slot.ToString(CultureInfo.InvariantCulture)).Append("</td>");
                Cell(h, NumberText.Count(g.Count));
                Cell(h, format(g.Mean));
                Cell(h, NumberText.Offset(g.OffsetFromGrandMean));
                h.Append("</tr>\n");
            }

            h.Append("</table>\n");
        }

        var notes = ReportJsonWriter.Notes(r).ToList();
        if (slots.Reason is not null)
        {
            notes.Add("Slot bias: " + slots.Reason);
        }

        if (r.Chart is { Signals.Count: > 0 } withSignals)
        {
            foreach (var group in withSignals.Signals.GroupBy(SignalLabels.Label).OrderBy(g => g.Key, StringComparer.Ordinal))
            {
                var at = string.Join(", ", group.Take(10).Select(s => (s.Index + 1).ToString(CultureInfo.InvariantCulture)));
                notes.Add($"{group.Key} ({group.First().Description}): at run {at}{(group.Count() > 10 ? $" and {group.Count() - 10} more" : string.Empty)}.");
            }
        }

        if (notes.Count > 0)
        {
            h.Append("<ul class=\"notes\">\n");
            foreach (var note in notes)
            {
                h.Append("<li>").Append(E(note)).Append("</li>\n");
            }

            h.Append("</ul>\n");
        }

        h.Append("</section>\n");
    }

    private static void Groups(StringBuilder h, QualityReport report)
    {
        if (report.Query.GroupBy == ReportGrouping.None)
        {
            return;
        }

        var by = report.Query.GroupBy.ToString().ToLowerInvariant();
        var label = ReportText.Labeller(report);
        h.Append("<h2>By ").Append(E(by)).Append("</h2>\n<table>\n<tr><th>").Append(E(by)).Append("</th><th>Runs</th><th>Units</th><th>First pass</th><th>Final</th><th>Retests/unit</th><th>Errors</th></tr>\n");
        foreach (var g in report.Groups)
        {
            var y = g.Yield;
            h.Append("<tr><td>").Append(E(g.Key)).Append("</td>");
            Cell(h, NumberText.Count(y.Runs));
            Cell(h, NumberText.Count(y.Units));
            Cell(h, NumberText.Percent(y.FirstPassYield));
            Cell(h, NumberText.Percent(y.FinalYield));
            Cell(h, NumberText.Rate(y.RetestRate));
            Cell(h, NumberText.Percent(y.ErrorRate));
            h.Append("</tr>\n");
        }

        h.Append("</table>\n<p class=\"meta\">A unit's runs count in the group of its first run, so the groups add up to the overall figures.</p>\n<table>\n<tr><th>").Append(E(by)).Append(" · reading</th><th>n</th><th>Mean</th><th>SD overall</th><th>Cpk</th><th>Ppk</th></tr>\n");
        foreach (var g in report.Groups)
        {
            foreach (var r in g.Readings)
            {
                var whole = report.Readings.FirstOrDefault(x => x.Name == r.Name && x.SequenceId == r.SequenceId);
                var format = whole is null ? NumberText.Value : ReportText.ValueFormat(whole);
                h.Append("<tr><td>").Append(E(g.Key)).Append(" · ").Append(E(whole is null ? r.Name : label(whole))).Append("</td>");
                Cell(h, NumberText.Count(r.Count));
                Cell(h, format(r.Mean));
                Cell(h, format(r.StdDevOverall));
                Cell(h, NumberText.Index(r.Cpk), r.Cpk < 1.33);
                Cell(h, NumberText.Index(r.Ppk), r.Ppk < 1.33);
                h.Append("</tr>\n");
            }
        }

        h.Append("</table>\n");
    }

    private static void Figure(StringBuilder h, string dataUri, string alt, string caption) =>
        h.Append("<figure><img src=\"").Append(dataUri).Append("\" alt=\"").Append(E(alt)).Append("\"><figcaption>").Append(E(caption)).Append("</figcaption></figure>\n");

    private static void Pair(StringBuilder h, string key, string value) =>
        h.Append("<dt>").Append(E(key)).Append("</dt><dd>").Append(E(value)).Append("</dd>\n");

    private static void Cell(StringBuilder h, string text, bool low = false) =>
        h.Append(low ? "<td class=\"low\">" : "<td>").Append(E(text)).Append("</td>");

    private static string E(string text) => WebUtility.HtmlEncode(text);

    /// <summary>Encoded text that may break after each dot (reading names such as cal.reference.offset), not elsewhere.</summary>
    private static string Breakable(string text) => E(text).Replace(".", ".<wbr>", StringComparison.Ordinal);
}
