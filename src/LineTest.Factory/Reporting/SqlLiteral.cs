using System.Globalization;
using System.Text;
using NpgsqlTypes;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Writes a filter value as a PostgreSQL literal, for statements that take no parameters (<c>COPY (query) TO
/// STDOUT</c>). Texts are escape strings (<c>E'…'</c>, backslash and quote doubled), which read the same whatever
/// <c>standard_conforming_strings</c> is; every literal carries its type, so it compares as the parameter would.
/// </summary>
internal static class SqlLiteral
{
    /// <summary>The literal for <paramref name="value"/> of <paramref name="type"/> (the types the report filters use).</summary>
    /// <exception cref="ArgumentException">A text holds a NUL character, which PostgreSQL text cannot hold.</exception>
    public static string Of(NpgsqlDbType type, object value) => (type, value) switch
    {
        // Quoted, so a negative number is one literal (-9223372036854775808::bigint would negate an out-of-range one).
        (NpgsqlDbType.Bigint, long number) => "'" + number.ToString(CultureInfo.InvariantCulture) + "'::bigint",
        (NpgsqlDbType.Integer, int number) => "'" + number.ToString(CultureInfo.InvariantCulture) + "'::integer",
        (NpgsqlDbType.TimestampTz, DateTime instant) when instant.Kind == DateTimeKind.Utc =>
            "'" + instant.ToString("yyyy-MM-dd HH:mm:ss.ffffff", CultureInfo.InvariantCulture) + "+00'::timestamptz",
        (NpgsqlDbType.Text, string text) => Text(text),
        (NpgsqlDbType.Array | NpgsqlDbType.Text, string[] texts) => "ARRAY[" + string.Join(", ", texts.Select(Text)) + "]::text[]",
        _ => throw new ArgumentException($"No literal for a {type} parameter holding {value.GetType().Name} (timestamps must be UTC).", nameof(value)),
    };

    private static string Text(string text)
    {
        if (text.Contains('\0', StringComparison.Ordinal))
        {
            throw new ArgumentException("A text value holds a NUL character, which PostgreSQL text cannot hold.", nameof(text));
        }

        var builder = new StringBuilder(text.Length + 8).Append("E'");
        foreach (var c in text)
        {
            if (c == '\\')
            {
                builder.Append(@"\\");
            }
            else if (c == '\'')
            {
                builder.Append("''");
            }
            else
            {
                builder.Append(c);
            }
        }

        return builder.Append("'::text").ToString();
    }
}
