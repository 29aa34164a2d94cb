using System.Globalization;
using LineTest.Core.Statistics;
using LineTest.Web.Data;

namespace LineTest.Web.Live;

/// <summary>
/// Turns a station's recent runs into its tile. Yield comes from <see cref="YieldAnalysis"/>, the computation the
/// report uses, over the runs of the shift and of the day.
/// </summary>
public static class LineTiles
{
    /// <summary>With units in progress but no journal write for this long, the station is shown as stopped.</summary>
    public static readonly TimeSpan StoppedAfter = TimeSpan.FromMinutes(30);

    /// <summary>The earliest instant a tile looks at: the start of the shift or of the day, whichever is first.</summary>
    public static DateTimeOffset WindowStart(DateTimeOffset now, ShiftCalendar shifts)
    {
        ArgumentNullException.ThrowIfNull(shifts);
        var day = new DateTimeOffset(now.UtcDateTime.Date, TimeSpan.Zero);
        var shift = shifts.ShiftOf(now).Start;
        return shift < day ? shift : day;
    }

    /// <summary>The tile of <paramref name="station"/> at <paramref name="now"/>.</summary>
    public static StationTile Build(StationRuns station, DateTimeOffset now, ShiftCalendar shifts)
    {
        ArgumentNullException.ThrowIfNull(station);
        ArgumentNullException.ThrowIfNull(shifts);
        var (shiftStart, shiftEnd) = shifts.ShiftOf(now);
        var dayStart = new DateTimeOffset(now.UtcDateTime.Date, TimeSpan.Zero);
        var dayEnd = dayStart.AddDays(1);
        var runs = station.Runs;
        var inShift = new List<int>();
        var inDay = new List<int>();
        var last = -1;
        for (var r = 0; r < runs.Count; r++)
        {
            var ended = runs.EndedUtc(r);
            if (ended >= shiftStart && ended < shiftEnd)
            {
                inShift.Add(r);
            }

            if (ended >= dayStart && ended < dayEnd)
            {
                inDay.Add(r);
            }

            if (last < 0 || ended >= runs.EndedUtc(last))
            {
                last = r;
            }
        }

        var shiftYield = YieldAnalysis.Summarize(runs.Outcomes(inShift));
        var dayYield = YieldAnalysis.Summarize(runs.Outcomes(inDay));
        double? perHour = null;
        if (inShift.Count > 0)
        {
            // From the shift's start to now, or to the last run when the station's clock runs ahead (a simulator).
            var lastInShift = inShift.Max(runs.EndedUtc);
            var hours = ((lastInShift > now ? lastInShift : now) - shiftStart).TotalHours;
            perHour = inShift.Count / Math.Max(hours, 1.0 / 60);
        }

        var (state, kind) = State(station, now, last >= 0 ? runs.EndedUtc(last) : null);
        return new StationTile
        {
            Name = station.Name,
            Where = station.Where,
            State = state,
            StateKind = kind,
            ShiftRuns = inShift.Count,
            TodayRuns = inDay.Count,
            UnitsPerHour = perHour,
            ShiftFirstPassYield = shiftYield.FirstPassYield,
            TodayFirstPassYield = dayYield.FirstPassYield,
            LastSerial = last >= 0 ? runs.Serial(last) : null,
            LastVerdict = last >= 0 ? runs.Verdict(last) : null,
            LastEndedUtc = last >= 0 ? runs.EndedUtc(last) : null,
            LastReason = last >= 0 ? runs.Outcome(last) is { } o ? o.FailureName ?? o.ErrorReason : null : null,
            Factory = station.Factory,
            Backlog = station.Backlog,
        };
    }

    private static (string State, string Kind) State(StationRuns station, DateTimeOffset now, DateTimeOffset? lastEnded)
    {
        if (station.Problem is not null)
        {
            return ("cannot be read", "unreadable");
        }

        if (station.Factory is { } factory)
        {
            // Units in progress are not forwarded: from the factory database, only what arrived can be told.
            return ($"last run received {Clock(factory.LastReceivedUtc)}", "forwarded");
        }

        if (station.Live is not { } live)
        {
            return ("no runs stored yet", "waiting");
        }

        if (live.InProgress > 0)
        {
            var units = live.InProgress == 1 ? "1 unit" : live.InProgress.ToString(CultureInfo.InvariantCulture) + " units";
            if (live.LastProgressUtc is { } progress && now - progress > StoppedAfter)
            {
                return ($"stopped with {units} in progress since {Clock(progress)}", "stopped");
            }

            return ($"testing {units}", "testing");
        }

        return lastEnded is { } ended ? ($"idle since {Clock(ended)}", "idle") : ("idle, no run today", "idle");
    }

    /// <summary>HH:mm UTC.</summary>
    public static string Clock(DateTimeOffset instant) => instant.UtcDateTime.ToString("HH:mm", CultureInfo.InvariantCulture) + " UTC";
}
