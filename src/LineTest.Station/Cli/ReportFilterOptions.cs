using System.CommandLine;
using System.Globalization;
using LineTest.Reports.Loading;

namespace LineTest.Station.Cli;

/// <summary>The filter options shared by <c>linetest report</c> and <c>linetest export</c>.</summary>
internal sealed class ReportFilterOptions
{
    public Option<string?> From { get; } = new("--from") { Description = "Runs that ended on or after this UTC date or time (2025-03-04 or 2025-03-04T06:00:00Z)" };

    public Option<string?> To { get; } = new("--to") { Description = "Runs that ended up to this UTC date (inclusive) or before this UTC time" };

    public Option<string?> Station { get; } = new("--station") { Description = "Station id" };

    public Option<int?> Slot { get; } = new("--slot") { Description = "Slot number" };

    public Option<string?> Lot { get; } = new("--lot") { Description = "Production lot" };

    public Option<string?> Sequence { get; } = new("--sequence") { Description = "Sequence id" };

    public Option<int?> Revision { get; } = new("--revision") { Description = "Sequence revision" };

    public Option<string[]> Readings { get; } = new("--reading") { Description = "Reading name to include (repeatable; default all)" };

    public void AddTo(Command command)
    {
        foreach (Option option in new Option[] { From, To, Station, Slot, Lot, Sequence, Revision, Readings })
        {
            command.Options.Add(option);
        }
    }

    /// <summary>The query, or the reason the options do not make one.</summary>
    public (ReportQuery? Query, string? Error) ToQuery(ParseResult parse, ReportGrouping grouping)
    {
        if (!TryInstant(parse.GetValue(From), endOfDay: false, out var from, out var error)
            || !TryInstant(parse.GetValue(To), endOfDay: true, out var to, out error))
        {
            return (null, error);
        }

        if (from is { } f && to is { } t && !(f < t))
        {
            return (null, $"--from ({f:yyyy-MM-dd HH:mm:ss}Z) must be before --to ({t:yyyy-MM-dd HH:mm:ss}Z)");
        }

        return (new ReportQuery
        {
            FromUtc = from,
            ToUtc = to,
            Station = parse.GetValue(Station),
            Slot = parse.GetValue(Slot),
            Lot = parse.GetValue(Lot),
            SequenceId = parse.GetValue(Sequence),
            SequenceRevision = parse.GetValue(Revision),
            ReadingNames = parse.GetValue(Readings) ?? [],
            GroupBy = grouping,
        }, null);
    }

    /// <summary>
    /// A date alone means the start of that UTC day for --from and the end of it for --to (so --to 2025-03-04
    /// includes the 4th); a time without an offset is UTC.
    /// </summary>
    internal static bool TryInstant(string? text, bool endOfDay, out DateTimeOffset? instant, out string? error)
    {
        instant = null;
        error = null;
        if (string.IsNullOrWhiteSpace(text))
        {
            return true;
        }

        var option = endOfDay ? "--to" : "--from";
        if (DateOnly.TryParseExact(text.Trim(), "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var date))
        {
            var start = new DateTimeOffset(date.ToDateTime(TimeOnly.MinValue), TimeSpan.Zero);
            instant = endOfDay ? start.AddDays(1) : start;
            return true;
        }

        if (DateTimeOffset.TryParse(text.Trim(), CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out var value))
        {
            instant = value;
            return true;
        }

        error = $"{option} '{text}' is not a date (2025-03-04) or a date and time (2025-03-04T06:00:00Z)";
        return false;
    }
}
