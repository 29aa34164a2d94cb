using System.Globalization;
using LineTest.Core.Results;
using LineTest.Storage.History;

namespace LineTest.Station.Screen;

/// <summary>A unit's history as lines for people: on the operator screen and from <c>linetest history</c>.</summary>
public static class HistoryLines
{
    /// <summary>Most runs listed on the operator screen (the latest; <c>linetest history</c> lists all).</summary>
    public const int OnScreen = 5;

    /// <summary>The title line and the latest <see cref="OnScreen"/> runs, newest last.</summary>
    public static IReadOnlyList<string> ForScreen(string serial, IReadOnlyList<HistoryEntry> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);
        if (runs.Count == 0)
        {
            return [$"History of {serial}: no runs stored."];
        }

        var lines = new List<string> { Title(serial, runs) };
        if (runs.Count > OnScreen)
        {
            lines.Add($"  ({runs.Count - OnScreen} earlier; 'linetest history {serial}' lists all)");
        }

        lines.AddRange(runs.Skip(Math.Max(0, runs.Count - OnScreen)).Select(Line));
        return lines;
    }

    /// <summary>The title line.</summary>
    public static string Title(string serial, IReadOnlyList<HistoryEntry> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);
        return $"History of {serial}: {runs.Count} run{(runs.Count == 1 ? string.Empty : "s")}";
    }

    /// <summary>One run: time (UTC), station, slot, verdict, first failing reading, reason, where it went.</summary>
    public static string Line(HistoryEntry run)
    {
        ArgumentNullException.ThrowIfNull(run);
        var line = string.Create(CultureInfo.InvariantCulture,
            $"  {run.EndedUtc.UtcDateTime:yyyy-MM-dd HH:mm}  {run.Station} slot {run.Slot}  {StateWords.Of(run.Verdict),-5}");
        if (run.Verdict != Verdict.Pass)
        {
            var reason = run.Reason ?? string.Empty;
            line += run.FirstFailingReading is { } reading && !reason.StartsWith(reading, StringComparison.Ordinal)
                ? $"  {reading}: {reason}"
                : $"  {reason}";
        }

        return run.Disposition is { } place ? $"{line}  → {place}" : line;
    }
}
