using System.Globalization;

namespace LineTest.Reports.Loading;

/// <summary>
/// The factory's shifts by their start times of day (UTC), e.g. early 06:00, late 14:00, night 22:00: a shift runs
/// from its start to the next shift's start, the last one past midnight to the first. From the station settings
/// (<c>Station:Shifts</c>, the one shift setting of the reports and the live page).
/// </summary>
public sealed class NamedShifts
{
    private readonly (TimeOnly Start, string Name)[] _shifts;

    /// <summary>Creates a calendar; names must be distinct and non-empty, start times distinct.</summary>
    public NamedShifts(IEnumerable<(string Name, TimeOnly StartUtc)> shifts)
    {
        ArgumentNullException.ThrowIfNull(shifts);
        _shifts = shifts.Select(s => (s.StartUtc, s.Name)).OrderBy(s => s.StartUtc).ToArray();
        if (_shifts.Length == 0)
        {
            throw new ArgumentException("A shift calendar needs at least one shift.", nameof(shifts));
        }

        if (_shifts.Any(s => string.IsNullOrWhiteSpace(s.Name)))
        {
            throw new ArgumentException("Every shift needs a name.", nameof(shifts));
        }

        if (_shifts.Select(s => s.Start).Distinct().Count() != _shifts.Length || _shifts.Select(s => s.Name).Distinct(StringComparer.Ordinal).Count() != _shifts.Length)
        {
            throw new ArgumentException("Shift names and start times must be distinct.", nameof(shifts));
        }
    }

    /// <summary>Three eight-hour shifts starting 06:00, 14:00 and 22:00 UTC, used when the settings name none.</summary>
    public static NamedShifts Default { get; } = new([("early", new TimeOnly(6, 0)), ("late", new TimeOnly(14, 0)), ("night", new TimeOnly(22, 0))]);

    /// <summary>The start times of day (UTC) in order.</summary>
    public IReadOnlyList<TimeOnly> Starts => [.. _shifts.Select(s => s.Start)];

    /// <summary>The shifts in start order, as "name from HH:mm".</summary>
    public string Describe() =>
        string.Join(", ", _shifts.Select(s => $"{s.Name} from {s.Start.ToString("HH:mm", CultureInfo.InvariantCulture)}")) + " UTC";

    /// <summary>The name of the shift that <paramref name="instant"/> falls in.</summary>
    public string ShiftOf(DateTimeOffset instant)
    {
        var time = TimeOnly.FromTimeSpan(instant.UtcDateTime.TimeOfDay);
        var name = _shifts[^1].Name;
        foreach (var (start, shift) in _shifts)
        {
            if (time >= start)
            {
                name = shift;
            }
        }

        return name;
    }

    /// <summary>Parses "name=HH:mm" entries, e.g. "early=06:00"; the error names the bad entry.</summary>
    public static (NamedShifts? Calendar, string? Error) Parse(IEnumerable<string> entries)
    {
        ArgumentNullException.ThrowIfNull(entries);
        var shifts = new List<(string, TimeOnly)>();
        foreach (var entry in entries)
        {
            var parts = entry.Split('=', 2, StringSplitOptions.TrimEntries);
            if (parts.Length != 2 || parts[0].Length == 0
                || !TimeOnly.TryParseExact(parts[1], "HH:mm", CultureInfo.InvariantCulture, DateTimeStyles.None, out var start))
            {
                return (null, $"shift '{entry}' is not name=HH:mm (e.g. early=06:00, UTC)");
            }

            shifts.Add((parts[0], start));
        }

        try
        {
            return (new NamedShifts(shifts), null);
        }
        catch (ArgumentException ex)
        {
            return (null, ex.Message);
        }
    }
}
