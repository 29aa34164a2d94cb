using System.Text;

namespace LineTest.Web.Pages;

/// <summary>The frame every page shares: head, navigation, main, footer. Assets come from this program only.</summary>
internal static class PageFrame
{
    /// <summary>The navigation entries: path and label.</summary>
    public static readonly (string Path, string Label)[] Sections =
    [
        ("/", "Line now"),
        ("/yield", "Yield"),
        ("/capability", "Capability"),
        ("/units", "Unit history"),
    ];

    /// <summary>A whole page around <paramref name="main"/> (HTML).</summary>
    /// <param name="title">Page title (text).</param>
    /// <param name="section">Path of the active navigation entry.</param>
    /// <param name="main">The page's content (HTML).</param>
    /// <param name="footer">Footer text: what was read and when.</param>
    /// <param name="script">Script asset to load, or null.</param>
    public static string Page(string title, string section, string main, string footer, string? script = null)
    {
        var html = new StringBuilder(main.Length + 2048);
        html.Append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">")
            .Append("<title>").Append(Html.E(title)).Append(" · LineTest</title>")
            .Append("<link rel=\"stylesheet\" href=\"/assets/site.css\">");
        if (script is not null)
        {
            html.Append("<script src=\"/assets/").Append(Html.E(script)).Append("\" defer></script>");
        }

        html.Append("</head><body><header class=\"top\"><span class=\"brand\">LineTest</span><nav>");
        foreach (var (path, label) in Sections)
        {
            html.Append("<a href=\"").Append(path).Append('"');
            if (path == section)
            {
                html.Append(" aria-current=\"page\"");
            }

            html.Append('>').Append(Html.E(label)).Append("</a>");
        }

        html.Append("</nav><span class=\"readonly\">read-only</span></header><main><h1>").Append(Html.E(title)).Append("</h1>")
            .Append(main)
            .Append("</main><footer>").Append(Html.E(footer)).Append("</footer></body></html>\n");
        return html.ToString();
    }

    /// <summary>A notice box (text).</summary>
    public static string Notice(string text) => "<p class=\"notice\">" + Html.E(text) + "</p>";
}
