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
    public static DateTimeOffset Parse(string text) =>
        DateTimeOffset.ParseExact(text, Format, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal);
}
