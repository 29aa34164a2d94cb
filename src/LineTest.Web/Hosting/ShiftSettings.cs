using System.Globalization;
using LineTest.Reports.Loading;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>
/// The factory's shifts, one setting for every part of LineTest: <c>Station:Shifts</c> (shift name → start time of day,
/// UTC, HH:mm) names the shifts of <c>report --by shift</c> and bounds "this shift" on the live page; empty means
/// early 06:00, late 14:00, night 22:00. The live page's older <c>Station:Web:ShiftStartsUtc</c> (a list of start
/// times) is still read when <c>Station:Shifts</c> is not set, each start naming its own shift, with a warning.
/// </summary>
public static partial class ShiftSettings
{
    /// <summary>The setting: name → HH:mm (UTC).</summary>
    public const string Key = "Station:Shifts";

    /// <summary>The live page's former setting, a list of HH:mm start times; read with a warning.</summary>
    public const string DeprecatedKey = "Station:Web:ShiftStartsUtc";

    /// <summary>
    /// The shifts in <paramref name="configuration"/>. <c>Error</c> says which entry is wrong (and no calendar is
    /// given); <c>Deprecation</c> is a warning to log when the older key was read or is ignored.
    /// </summary>
    public static (NamedShifts? Shifts, string? Error, string? Deprecation) Read(IConfiguration configuration)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        var named = configuration.GetSection(Key).GetChildren().Select(c => $"{c.Key}={c.Value}").ToList();
        var old = configuration.GetSection(DeprecatedKey).GetChildren().Select(c => c.Value?.Trim() ?? string.Empty).ToList();
        if (named.Count > 0)
        {
            var (shifts, error) = NamedShifts.Parse(named);
            var ignored = old.Count > 0 ? $"{DeprecatedKey} is no longer read and is ignored: {Key} names the shifts; remove {DeprecatedKey} from the settings" : null;
            return (shifts, error is null ? null : $"{Key}: {error}", ignored);
        }

        if (old.Count > 0)
        {
            var bad = old.FirstOrDefault(start => !TimeOnly.TryParseExact(start, "HH:mm", CultureInfo.InvariantCulture, DateTimeStyles.None, out _));
            if (bad is not null)
            {
                return (null, $"{DeprecatedKey}: '{bad}' is not a time of day HH:mm (UTC)", null);
            }

            var (shifts, error) = NamedShifts.Parse(old.Select(start => $"{start}={start}"));
            var advice = $"{DeprecatedKey} is deprecated: name the shifts in {Key} instead, e.g. \"Shifts\": {{ \"early\": \"06:00\", \"late\": \"14:00\", \"night\": \"22:00\" }} in the Station section";
            return (shifts, error is null ? null : $"{DeprecatedKey}: {error}", advice);
        }

        return (NamedShifts.Default, null, null);
    }

    /// <summary>Logs the warning from <see cref="Read"/>.</summary>
    [LoggerMessage(EventId = 4090, Level = LogLevel.Warning, Message = "Shift settings: {Warning}")]
    public static partial void LogDeprecation(ILogger logger, string warning);
}
