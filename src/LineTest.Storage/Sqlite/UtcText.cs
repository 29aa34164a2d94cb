using System.Globalization;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Instants as stored in the database: ISO 8601 in UTC with seven fraction digits and a trailing Z,
/// e.g. <c>2025-03-04T05:06:07.1234567Z</c>. Fixed width, so text order is time order.
/// </summary>
public static class UtcText
{
    /// <summary>The exact format of every stored instant.</summary>
    public const string Format = "yyyy'-'MM'-'dd'T'HH':'mm':'ss'.'fffffff'Z'";

    /// <summary>Formats an instant as stored text (converted to UTC).</summary>
    public static string ToText(DateTimeOffset instant) =>
        instant.UtcDateTime.ToString(Format, CultureInfo.InvariantCulture);

    /// <summary>Parses stored text back to an instant with a zero offset.</summary>
    /// <exception cref="FormatException">The text is not in <see cref="Format"/>.</exception>
    public static DateTimeOffset Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        // Report scans parse one instant per run; the fixed layout is read directly, which is many times faster
        // than a general format parse. Anything that does not fit the layout goes to the exact parser for its error.
        if (text.Length == 28 && text[4] == '-' && text[7] == '-' && text[10] == 'T' && text[13] == ':' && text[16] == ':'
            && text[19] == '.' && text[27] == 'Z'
            && TryDigits(text, 0, 4, out var year) && TryDigits(text, 5, 2, out var month) && TryDigits(text, 8, 2, out var day)
            && TryDigits(text, 11, 2, out var hour) && TryDigits(text, 14, 2, out var minute) && TryDigits(text, 17, 2, out var second)
            && TryDigits(text, 20, 7, out var fraction)
            && year >= 1 && month is >= 1 and <= 12 && day >= 1 && day <= DateTime.DaysInMonth(year, month)
            && hour < 24 && minute < 60 && second < 60)
        {
            var utc = new DateTime(year, month, day, hour, minute, second, DateTimeKind.Utc).AddTicks(fraction);
            return new DateTimeOffset(utc);
        }

        return DateTimeOffset.ParseExact(text, Format, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal);
    }

    /// <summary>Parses stored text back to an instant; null when it is missing or not in <see cref="Format"/>.</summary>
    public static DateTimeOffset? TryParse(string? text)
    {
        if (text is null)
        {
            return null;
        }

        try
        {
            return Parse(text);
        }
        catch (FormatException)
        {
            return null;
        }
    }

    private static bool TryDigits(string text, int start, int count, out int value)
    {
        value = 0;
        for (var i = start; i < start + count; i++)
        {
            var digit = text[i] - '0';
            if ((uint)digit > 9)
            {
                return false;
            }

            value = (value * 10) + digit;
        }

        return true;
    }
}
