using System.Globalization;
using System.Text;
using LineTest.Core.Results;
using LineTest.Reports.Building;
using LineTest.Storage.Sqlite;

namespace LineTest.Web.Pages;

/// <summary>Unit history: search by serial or prefix, and every run of one unit with its readings and record hash.</summary>
internal static class HistoryPage
{
    /// <summary>Most serials a prefix search lists.</summary>
    public const int MaxMatches = 200;

    /// <summary>The search form, with the matches of a prefix when one was given.</summary>
    public static string Search(string? prefix, IReadOnlyList<string>? matches)
    {
        var html = new StringBuilder();
        html.Append("<form class=\"filters\" method=\"get\" action=\"/units\"><label>Serial or its beginning <input type=\"search\" name=\"serial\" value=\"")
            .Append(Html.E(prefix)).Append("\" autofocus></label><button type=\"submit\">Search</button></form>");
        if (prefix is null || matches is null)
        {
            return html.ToString();
        }

        if (matches.Count == 0)
        {
            html.Append(PageFrame.Notice($"No stored run has a serial that starts with '{prefix}'."));
            return html.ToString();
        }

        html.Append("<p>").Append(matches.Count >= MaxMatches ? $"The first {MaxMatches} serials" : $"{matches.Count} serial{(matches.Count == 1 ? string.Empty : "s")}")
            .Append(" starting with ").Append(Html.E(prefix)).Append(":</p><ul class=\"serials\">");
        foreach (var serial in matches)
        {
            html.Append("<li><a href=\"/units/").Append(Html.E(Html.U(serial))).Append("\">").Append(Html.E(serial)).Append("</a></li>");
        }

        html.Append("</ul>");
        return html.ToString();
    }

    /// <summary>Every run of one unit, oldest first.</summary>
    public static string History(string serial, IReadOnlyList<StoredRun> runs)
    {
        var html = new StringBuilder(Search(null, null));
        if (runs.Count == 0)
        {
            html.Append(PageFrame.Notice($"No stored run of unit {serial}."));
            return html.ToString();
        }

        html.Append("<p class=\"lead\">").Append(runs.Count.ToString(CultureInfo.InvariantCulture)).Append(runs.Count == 1 ? " run" : " runs").Append(", oldest first.</p>");
        var number = 0;
        foreach (var stored in runs)
        {
            number++;
            var run = stored.Run;
            html.Append("<section class=\"run\"><h2>Run ").Append(number.ToString(CultureInfo.InvariantCulture)).Append(": ");
            Html.Verdict(html, run.Verdict);
            html.Append(" at ").Append(Html.E(Html.Utc(run.EndedUtc))).Append("</h2><table class=\"figures\"><tbody>");
            Html.Row(html, "Started", Html.E(Html.Utc(run.StartedUtc)));
            Html.Row(html, "Station · fixture · slot", Html.E($"{run.Station} · {run.Fixture} · slot {run.Slot.ToString(CultureInfo.InvariantCulture)}"));
            Html.Row(html, "Product · sequence", Html.E($"{run.Product} · {run.SequenceId} revision {run.SequenceRevision.ToString(CultureInfo.InvariantCulture)} ({run.Mode})"));
            Html.Row(html, "Sequence SHA-256", "<code>" + Html.E(run.SequenceSha256) + "</code>");
            Html.Row(html, "Lot · batch · operator", Html.E($"{run.Lot ?? NumberText.NotDefined} · {run.BatchId ?? NumberText.NotDefined} · {run.Operator ?? NumberText.NotDefined}"));
            if (run.Reason is not null)
            {
                Html.Row(html, "Reason", Html.E(run.Reason) + (run.FirstFailingReading is { } f ? " (first failing reading " + Html.E(f) + ")" : string.Empty));
            }

            Html.Row(html, "Record hash", "<code class=\"hash\">" + Html.E(stored.RecordSha256) + "</code> (seq " + stored.Seq.ToString(CultureInfo.InvariantCulture) + ")");
            html.Append("</tbody></table>");
            Readings(html, run.Readings);
            if (run.Trim is { } trim)
            {
                html.Append("<p class=\"trim\">Trim (").Append(Html.E(trim.Method)).Append(trim.InRange ? ")" : ", out of range)").Append(": ")
                    .Append(Html.E(string.Join(", ", trim.Values.Select(kv => kv.Key + " = " + NumberText.Value(kv.Value))))).Append("</p>");
            }

            html.Append("</section>");
        }

        return html.ToString();
    }

    private static void Readings(StringBuilder html, IReadOnlyList<Reading> readings)
    {
        if (readings.Count == 0)
        {
            html.Append(PageFrame.Notice("No readings were taken."));
            return;
        }

        html.Append("<div class=\"scroll\"><table class=\"readings\"><thead><tr><th>Reading</th><th>Setpoint</th><th>Value</th><th>Unit</th>")
            .Append("<th>Low</th><th>High</th><th>Acceptance</th><th>Rule</th><th>U (k)</th><th>Decision</th></tr></thead><tbody>");
        foreach (var r in readings)
        {
            html.Append("<tr><td>").Append(Html.E(r.Name)).Append("</td><td>").Append(Html.E(r.Setpoint))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Value(r.Value)))
                .Append("</td><td>").Append(Html.E(r.Unit))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Value(r.Low)))
                .Append("</td><td class=\"n\">").Append(Html.E(NumberText.Value(r.High)))
                .Append("</td><td class=\"n\">").Append(r.AcceptanceLow is null && r.AcceptanceHigh is null
                    ? string.Empty
                    : Html.E($"{NumberText.Value(r.AcceptanceLow)} … {NumberText.Value(r.AcceptanceHigh)}"))
                .Append("</td><td>").Append(Html.E(r.DecisionRule))
                .Append("</td><td class=\"n\">").Append(r.ExpandedUncertainty is { } u
                    ? Html.E(NumberText.Value(u) + (r.CoverageFactor is { } k ? " (k=" + NumberText.Value(k) + ")" : string.Empty))
                    : string.Empty)
                .Append("</td><td>");
            Html.Verdict(html, r.Verdict);
            if (r.Note is { } note)
            {
                html.Append(' ').Append(Html.E(note));
            }

            html.Append("</td></tr>");
        }

        html.Append("</tbody></table></div>");
    }
}
