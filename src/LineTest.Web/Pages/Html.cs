using System.Globalization;
using System.Net;
using System.Text;

namespace LineTest.Web.Pages;

/// <summary>Small helpers for writing HTML by hand: every text goes through <see cref="E"/>.</summary>
internal static class Html
{
    /// <summary>HTML-encodes text (null as empty).</summary>
    public static string E(string? text) => WebUtility.HtmlEncode(text ?? string.Empty);

    /// <summary>URL-encodes a query value.</summary>
    public static string U(string? text) => Uri.EscapeDataString(text ?? string.Empty);

    /// <summary>A query string from the non-empty pairs, e.g. "?station=ST-01&amp;lot=L1" (HTML-encoded), or "".</summary>
    public static string Query(params (string Key, string? Value)[] pairs)
    {
        var parts = pairs.Where(p => !string.IsNullOrWhiteSpace(p.Value)).Select(p => p.Key + "=" + U(p.Value)).ToList();
        return parts.Count == 0 ? string.Empty : E("?" + string.Join("&", parts));
    }

    /// <summary>An instant as yyyy-MM-dd HH:mm:ss UTC.</summary>
    public static string Utc(DateTimeOffset instant) =>
        instant.UtcDateTime.ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture) + " UTC";

    /// <summary>A verdict as a marked word.</summary>
    public static void Verdict(StringBuilder html, Core.Results.Verdict verdict)
    {
        var word = Core.Results.VerdictExtensions.ToWord(verdict);
        html.Append("<span class=\"verdict ").Append(word).Append("\">").Append(word).Append("</span>");
    }

    /// <summary>A table row of header and value cells, already HTML.</summary>
    public static void Row(StringBuilder html, string header, string valueHtml) =>
        html.Append("<tr><th scope=\"row\">").Append(E(header)).Append("</th><td>").Append(valueHtml).Append("</td></tr>");
}
