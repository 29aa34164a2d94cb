using System.Globalization;

namespace LineTest.Web.Live;

/// <summary>Shifts as a repeating list of start times (UTC); a shift runs from its start to the next one.</summary>
public sealed class ShiftCalendar
{
    private readonly TimeOnly[] _starts;

    /// <summary>Creates a calendar from at least one start time.</summary>
    public ShiftCalendar(IReadOnlyList<TimeOnly> starts)
    {
        ArgumentNullException.ThrowIfNull(starts);
        if (starts.Count == 0)
        {
            throw new ArgumentException("At least one shift start is needed.", nameof(starts));
        }

        _starts = [.. starts.Distinct().Order()];
    }

    /// <summary>The shift that holds <paramref name="instant"/>: its start (inclusive) and end (exclusive), UTC.</summary>
    public (DateTimeOffset Start, DateTimeOffset End) ShiftOf(DateTimeOffset instant)
    {
        var utc = instant.ToUniversalTime();
        var day = new DateTimeOffset(utc.Date, TimeSpan.Zero);
        var time = TimeOnly.FromTimeSpan(utc.TimeOfDay);

        // The last start at or before the time of day; before the first start, the last start of the day before.
        var index = Array.FindLastIndex(_starts, s => s <= time);
        var start = index >= 0 ? day + _starts[index].ToTimeSpan() : day.AddDays(-1) + _starts[^1].ToTimeSpan();
        var nextIndex = index + 1;
        var end = nextIndex < _starts.Length ? day + _starts[nextIndex].ToTimeSpan() : day.AddDays(1) + _starts[0].ToTimeSpan();
        if (index < 0)
        {
            end = day + _starts[0].ToTimeSpan();
        }

        return (start, end);
    }

    /// <summary>A shift's label, e.g. "2026-12-03 06:00".</summary>
    public static string Label(DateTimeOffset shiftStart) =>
        shiftStart.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture);
}
