using System.Globalization;
using System.Text;
using LineTest.Factory.Reporting;
using LineTest.Reports.Building;
using LineTest.Web.Live;

namespace LineTest.Web.Pages;

/// <summary>Line now: one tile per station, replaced live by <c>/line/events</c>.</summary>
internal static class LinePage
{
    /// <summary>The whole page with the tiles of now.</summary>
    public static string Render(IReadOnlyList<StationTile> tiles, DateTimeOffset now, string shiftLabel, string footer)
    {
        var main = new StringBuilder();
        main.Append("<p class=\"lead\">Shift from ").Append(Html.E(shiftLabel))
            .Append(" UTC. <span id=\"live-status\" class=\"live\">updated ").Append(Html.E(LineTiles.Clock(now)))
            .Append("</span></p><div id=\"tiles\" class=\"tiles\">")
            .Append(Tiles(tiles))
            .Append("</div>");
        return PageFrame.Page("Line now", "/", main.ToString(), footer, "line.js");
    }

    /// <summary>The tiles alone (what the live events carry).</summary>
    public static string Tiles(IReadOnlyList<StationTile> tiles)
    {
        var html = new StringBuilder();
        if (tiles.Count == 0)
        {
            return PageFrame.Notice("No results folder is being read.");
        }

        foreach (var t in tiles)
        {
            html.Append("<section class=\"tile ").Append(Html.E(t.StateKind)).Append("\" data-station=\"").Append(Html.E(t.Name)).Append("\">")
                .Append("<h2>").Append(Html.E(t.Name)).Append("</h2>")
                .Append("<p class=\"state\">").Append(Html.E(t.State)).Append("</p>")
                .Append("<dl>");
            Item(html, "Runs this shift", Count(t.ShiftRuns), "shift-runs");
            Item(html, "Units per hour this shift", t.UnitsPerHour is { } uph ? uph.ToString("F1", CultureInfo.InvariantCulture) : NumberText.NotDefined, "units-per-hour");
            Item(html, "First-pass yield this shift", NumberText.Percent(t.ShiftFirstPassYield), "shift-fpy");
            Item(html, "First-pass yield today", NumberText.Percent(t.TodayFirstPassYield), "today-fpy");
            Item(html, "Runs today", Count(t.TodayRuns), "today-runs");
            html.Append("</dl><p class=\"last\">");
            if (t.LastSerial is { } serial && t.LastVerdict is { } verdict && t.LastEndedUtc is { } ended)
            {
                html.Append("Last run: <a href=\"/units/").Append(Html.E(Html.U(serial))).Append("\">").Append(Html.E(serial)).Append("</a> ");
                Html.Verdict(html, verdict);
                html.Append(" at ").Append(Html.E(LineTiles.Clock(ended)));
                if (t.LastReason is { } reason)
                {
                    html.Append(" · ").Append(Html.E(reason));
                }
            }
            else
            {
                html.Append("No run today.");
            }

            html.Append("</p>");
            if (t.Factory is { } factory)
            {
                Forwarding(html, factory);
            }

            if (t.Backlog is { } backlog)
            {
                // Counted by the station itself: runs stored and not yet committed by the factory database.
                html.Append("<p class=\"backlog\" data-key=\"backlog\">").Append(Html.E(backlog.Describe())).Append("</p>");
            }

            html.Append("<p class=\"where\">").Append(Html.E(t.Where)).Append("</p></section>");
        }

        return html.ToString();
    }

    /// <summary>
    /// What the factory database holds of the station. The server cannot count the station's backlog (runs stored but
    /// not sent never reach it), so the tile says what it does know and where the backlog is counted.
    /// </summary>
    private static void Forwarding(StringBuilder html, FactoryStationHead f)
    {
        html.Append("<div class=\"forwarding\"><h3>Forwarded to the factory database</h3><dl>");
        Item(html, "Runs held", NumberText.Count(f.RunsHeld), "factory-runs");
        Item(html, "Through station seq", f.HeadSeq.ToString(CultureInfo.InvariantCulture), "factory-head-seq");
        Item(html, "Last received (server clock)", Html.Utc(f.LastReceivedUtc), "factory-received");
        Item(html, "Newest run held ended (station clock)", f.LastEndedUtc is { } ended ? Html.Utc(ended) : NumberText.NotDefined, "factory-ended");
        if (f.Refused > 0)
        {
            Item(html, "Runs refused (alarms)", NumberText.Count(f.Refused), "factory-refused");
        }

        if (f.Chains > 1)
        {
            Item(html, "Station databases", f.Chains.ToString(CultureInfo.InvariantCulture), "factory-chains");
        }

        html.Append("</dl><p class=\"note\">Backlog: runs this station stored but has not sent yet cannot be seen from here; ")
            .Append("the station counts them (its screen and its own page). While it tests, a last-received time that stops moving means runs are waiting.</p></div>");
    }

    private static string Count(int n) => NumberText.Count(n);

    private static void Item(StringBuilder html, string label, string value, string key) =>
        html.Append("<div><dt>").Append(Html.E(label)).Append("</dt><dd data-key=\"").Append(key).Append("\">").Append(Html.E(value)).Append("</dd></div>");
}
