using System.Globalization;
using LineTest.Storage.Sqlite;

namespace LineTest.Reports.Loading;

/// <summary>
/// Which runs and readings a report covers, and how it groups them. Every condition combines with AND;
/// an unset condition matches everything.
/// </summary>
public sealed record ReportQuery
{
    /// <summary>Everything, ungrouped.</summary>
    public static ReportQuery All { get; } = new();

    /// <summary>Runs that ended at or after this instant.</summary>
    public DateTimeOffset? FromUtc { get; init; }

    /// <summary>Runs that ended before this instant (exclusive).</summary>
    public DateTimeOffset? ToUtc { get; init; }

    /// <summary>Station id.</summary>
    public string? Station { get; init; }

    /// <summary>Slot number, 1-based.</summary>
    public int? Slot { get; init; }

    /// <summary>Production lot.</summary>
    public string? Lot { get; init; }

    /// <summary>Sequence id.</summary>
    public string? SequenceId { get; init; }

    /// <summary>Sequence revision.</summary>
    public int? SequenceRevision { get; init; }

    /// <summary>Reading names to analyse; empty for all. Yield always counts every matching run.</summary>
    public IReadOnlyList<string> ReadingNames { get; init; } = [];

    /// <summary>How runs are grouped.</summary>
    public ReportGrouping GroupBy { get; init; }

    /// <summary>Capability and the failure Pareto from each unit's first run only (<c>--first-runs</c>).</summary>
    public bool FirstRunsOnly { get; init; }

    /// <summary>The factory's shifts for <see cref="ReportGrouping.Shift"/>; null for <see cref="NamedShifts.Default"/>.</summary>
    public NamedShifts? Shifts { get; init; }

    /// <summary>The same conditions as a storage filter.</summary>
    public RunFilter ToRunFilter() => new()
    {
        FromUtc = FromUtc,
        ToUtc = ToUtc,
        Station = Station,
        Slot = Slot,
        Lot = Lot,
        SequenceId = SequenceId,
        SequenceRevision = SequenceRevision,
        ReadingNames = ReadingNames.Count == 0 ? null : ReadingNames,
    };

    /// <summary>True when <paramref name="name"/> is one of the readings asked for (or no names were given).</summary>
    public bool WantsReading(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        if (ReadingNames.Count == 0)
        {
            return true;
        }

        foreach (var wanted in ReadingNames)
        {
            if (string.Equals(wanted, name, StringComparison.Ordinal))
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>The conditions in words, e.g. "station ST-01, from 2025-03-01 00:00 UTC"; "all runs" when none.</summary>
    public string Describe()
    {
        var parts = new List<string>();
        if (FromUtc is { } from)
        {
            parts.Add("from " + Instant(from));
        }

        if (ToUtc is { } to)
        {
            parts.Add("before " + Instant(to));
        }

        if (Station is not null)
        {
            parts.Add("station " + Station);
        }

        if (Slot is { } slot)
        {
            parts.Add("slot " + slot.ToString(CultureInfo.InvariantCulture));
        }

        if (Lot is not null)
        {
            parts.Add("lot " + Lot);
        }

        if (SequenceId is not null)
        {
            parts.Add("sequence " + SequenceId);
        }

        if (SequenceRevision is { } revision)
        {
            parts.Add("revision " + revision.ToString(CultureInfo.InvariantCulture));
        }

        if (ReadingNames.Count > 0)
        {
            parts.Add("readings " + string.Join(", ", ReadingNames));
        }

        if (FirstRunsOnly)
        {
            parts.Add("capability and failures from first runs only");
        }

        return parts.Count == 0 ? "all runs" : string.Join("; ", parts);
    }

    private static string Instant(DateTimeOffset value) =>
        value.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC";
}
