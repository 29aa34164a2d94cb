using System.Globalization;
using System.Text;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using Microsoft.AspNetCore.Http;

namespace LineTest.Web.Pages;

/// <summary>
/// The filters of the yield and capability pages, read from the URL so a view can be bookmarked or sent:
/// <c>station</c>, <c>lot</c>, <c>product</c> (with <c>sequence</c> when a product has several), <c>from</c>,
/// <c>to</c> (UTC dates, <c>to</c> inclusive).
/// </summary>
internal sealed record PageFilters
{
    /// <summary>Days the yield page shows when no date is chosen: today (UTC) and the six days before.</summary>
    public const int DefaultDays = 7;

    public string? Station { get; init; }

    public string? Lot { get; init; }

    public string? Product { get; init; }

    public string? Sequence { get; init; }

    public string? From { get; init; }

    public string? To { get; init; }

    /// <summary>True when the dates were not chosen but filled in by <see cref="WithDefaultWindow"/>.</summary>
    public bool IsDefaultWindow { get; init; }

    /// <summary>
    /// With no date chosen, the last <see cref="DefaultDays"/> days up to <paramref name="now"/>'s day (UTC), written
    /// into <c>from</c> and <c>to</c> so the form shows them, links keep them and the source reads only that window;
    /// with either date chosen, unchanged.
    /// </summary>
    public PageFilters WithDefaultWindow(DateTimeOffset now)
    {
        if (From is not null || To is not null)
        {
            return this;
        }

        var today = DateOnly.FromDateTime(now.UtcDateTime);
        return this with
        {
            From = today.AddDays(1 - DefaultDays).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
            To = today.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
            IsDefaultWindow = true,
        };
    }

    /// <summary>Reads the filters from a query string.</summary>
    public static PageFilters Read(IQueryCollection query) => new()
    {
        Station = Value(query, "station"),
        Lot = Value(query, "lot"),
        Product = Value(query, "product"),
        Sequence = Value(query, "sequence"),
        From = Value(query, "from"),
        To = Value(query, "to"),
    };

    /// <summary>The filters as URL pairs (for links that keep them).</summary>
    public (string, string?)[] Pairs() =>
        [("station", Station), ("lot", Lot), ("product", Product), ("sequence", Sequence), ("from", From), ("to", To)];

    /// <summary>
    /// The report query, or the problems that stop one: a bad date, a product without runs, a product tested by
    /// several sequences (the page then offers each).
    /// </summary>
    public (ReportQuery? Query, IReadOnlyList<string> Problems) ToQuery(IReadOnlyList<ProductSequence> products)
    {
        var problems = new List<string>();
        foreach (var (name, value) in new[] { ("station", Station), ("lot", Lot), ("product", Product), ("sequence", Sequence) })
        {
            // No stored name holds one, and a NUL cannot even be sent to the factory database as text.
            if (value is not null && value.Any(char.IsControl))
            {
                problems.Add($"'{name}' holds a control character; type the {name} as it is written on the unit or the batch");
            }
        }

        var from = Date(From, "from", 0, problems);
        var to = Date(To, "to", 1, problems);
        if (from is { } f && to is { } t && !(f < t))
        {
            problems.Add($"'from' ({From}) must not be after 'to' ({To})");
        }

        string? sequence = Sequence;
        if (Product is { } product)
        {
            var sequences = products.Where(p => p.Product == product).Select(p => p.SequenceId).Distinct().ToList();
            if (sequences.Count == 0)
            {
                problems.Add($"no stored run is of product '{product}'");
            }
            else if (Sequence is { } chosen && !sequences.Contains(chosen))
            {
                problems.Add($"product '{product}' was not tested by sequence '{chosen}'; it was by {string.Join(", ", sequences)}");
            }
            else if (Sequence is null && sequences.Count > 1)
            {
                problems.Add($"product '{product}' was tested by sequences {string.Join(", ", sequences)}: choose one");
            }
            else
            {
                sequence ??= sequences[0];
            }
        }

        if (problems.Count > 0)
        {
            return (null, problems);
        }

        return (new ReportQuery { Station = Station, Lot = Lot, SequenceId = sequence, FromUtc = from, ToUtc = to }, problems);
    }

    /// <summary>
    /// When the product was tested by several sequences and none is chosen, a link per sequence to the same view with
    /// that sequence; otherwise empty.
    /// </summary>
    /// <param name="action">The view's path.</param>
    /// <param name="query">The view's query, kept in each link (its sequence replaced).</param>
    /// <param name="products">Products and their sequences.</param>
    public string SequenceChoices(string action, IQueryCollection query, IReadOnlyList<ProductSequence> products)
    {
        if (Product is null || Sequence is not null)
        {
            return string.Empty;
        }

        var sequences = products.Where(p => p.Product == Product).ToList();
        if (sequences.Select(p => p.SequenceId).Distinct().Count() < 2)
        {
            return string.Empty;
        }

        var html = new StringBuilder("<ul class=\"choices\">");
        foreach (var p in sequences)
        {
            var pairs = query.Where(kv => kv.Key != "sequence").Select(kv => (kv.Key, (string?)kv.Value.ToString())).Append(("sequence", p.SequenceId)).ToArray();
            html.Append("<li><a href=\"").Append(action).Append(Html.Query(pairs)).Append("\">").Append(Html.E(p.SequenceId)).Append("</a> (")
                .Append(p.Runs.ToString(CultureInfo.InvariantCulture)).Append(" runs)</li>");
        }

        return html.Append("</ul>").ToString();
    }

    /// <summary>The filter form (GET) with the product choices.</summary>
    public string Form(string action, IReadOnlyList<ProductSequence> products, string? extraName = null, string? extraValue = null)
    {
        var html = new StringBuilder();
        html.Append("<form class=\"filters\" method=\"get\" action=\"").Append(action).Append("\">");
        Field(html, "station", "Station", Station, "text");
        Field(html, "lot", "Lot", Lot, "text");
        html.Append("<label>Product <select name=\"product\"><option value=\"\">all</option>");
        foreach (var name in products.Select(p => p.Product).Distinct())
        {
            html.Append("<option").Append(name == Product ? " selected" : string.Empty).Append('>').Append(Html.E(name)).Append("</option>");
        }

        html.Append("</select></label>");
        if (Sequence is not null)
        {
            html.Append("<input type=\"hidden\" name=\"sequence\" value=\"").Append(Html.E(Sequence)).Append("\">");
        }

        if (extraName is not null)
        {
            html.Append("<input type=\"hidden\" name=\"").Append(extraName).Append("\" value=\"").Append(Html.E(extraValue)).Append("\">");
        }

        Field(html, "from", "From", From, "date");
        Field(html, "to", "To", To, "date");
        html.Append("<button type=\"submit\">Show</button></form>");
        return html.ToString();
    }

    private static void Field(StringBuilder html, string name, string label, string? value, string type) =>
        html.Append("<label>").Append(label).Append(" <input type=\"").Append(type).Append("\" name=\"").Append(name)
            .Append("\" value=\"").Append(Html.E(value)).Append("\"></label>");

    private static string? Value(IQueryCollection query, string key) =>
        query.TryGetValue(key, out var values) && values.Count > 0 && !string.IsNullOrWhiteSpace(values[0]) ? values[0]!.Trim() : null;

    private static DateTimeOffset? Date(string? text, string name, int addDays, List<string> problems)
    {
        if (text is null)
        {
            return null;
        }

        if (DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var date))
        {
            return new DateTimeOffset(date.ToDateTime(TimeOnly.MinValue), TimeSpan.Zero).AddDays(addDays);
        }

        problems.Add($"'{name}' must be a date like 2026-12-03, not '{text}'");
        return null;
    }
}
