using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using LineTest.Reports.Building;
using LineTest.Reports.Charts;
using LineTest.Reports.Loading;
using LineTest.Storage.Store;
using LineTest.Web.Access;
using LineTest.Web.Charts;
using LineTest.Web.Data;
using LineTest.Web.Live;
using LineTest.Web.Pages;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Routing;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>The page's routes. Every one is a GET that only reads.</summary>
internal static class WebPageEndpoints
{
    public static void Map(IEndpointRouteBuilder app)
    {
        app.MapGet("/assets/{name}", (string name) => AssetFiles.Serve(name));
        app.MapGet("/", LineAsync);
        app.MapGet("/line/events", LineEventsAsync);
        app.MapGet("/yield", YieldAsync);
        app.MapGet("/yield/pareto.svg", ParetoSvgAsync);
        app.MapGet("/capability", CapabilityAsync);
        app.MapGet("/capability/reading", ReadingAsync);
        app.MapGet("/capability/histogram.svg", (HttpContext c, IResultsSource s, TimeProvider t) => ReadingSvgAsync(c, s, t, HistogramChart.Create));
        app.MapGet("/capability/individuals.svg", (HttpContext c, IResultsSource s, TimeProvider t) => ReadingSvgAsync(c, s, t, IndividualsChartPlot.Create));
        app.MapGet("/units", UnitsAsync);
        app.MapGet("/units/{serial}", UnitAsync);
    }

    private static async Task<IResult> LineAsync(HttpContext context, LineMonitor monitor, ShiftCalendar shifts, TimeProvider time, IResultsSource source)
    {
        var (_, tiles) = await monitor.LookAsync(context.RequestAborted).ConfigureAwait(false);
        var now = time.GetUtcNow();
        return Page(LinePage.Render(tiles, now, ShiftCalendar.Label(shifts.ShiftOf(now).Start), Footer(source, time)));
    }

    private static async Task LineEventsAsync(HttpContext context, LineMonitor monitor, TimeProvider time, WebPageOptions options)
    {
        var ct = context.RequestAborted;
        context.Response.ContentType = "text/event-stream";
        context.Response.Headers.CacheControl = "no-store";
        var interval = TimeSpan.FromSeconds(options.RefreshSeconds);
        var quietSince = time.GetUtcNow();
        string? sent = null;
        try
        {
            while (!ct.IsCancellationRequested)
            {
                var (mark, tiles) = await monitor.LookAsync(ct).ConfigureAwait(false);
                var now = time.GetUtcNow();
                if (mark != sent)
                {
                    var json = JsonSerializer.Serialize(new LiveTiles(LinePage.Tiles(tiles), LineTiles.Clock(now)));
                    await context.Response.WriteAsync("event: tiles\ndata: " + json + "\n\n", Encoding.UTF8, ct).ConfigureAwait(false);
                    sent = mark;
                    quietSince = now;
                }
                else if (now - quietSince > TimeSpan.FromSeconds(15))
                {
                    // A comment line keeps proxies from closing a quiet stream.
                    await context.Response.WriteAsync(": quiet\n\n", ct).ConfigureAwait(false);
                    quietSince = now;
                }

                await context.Response.Body.FlushAsync(ct).ConfigureAwait(false);
                await Task.Delay(interval, time, ct).ConfigureAwait(false);
            }
        }
        catch (OperationCanceledException) when (ct.IsCancellationRequested)
        {
            // The page was closed.
        }
    }

    private static Task<IResult> YieldAsync(HttpContext context, IResultsSource source, ShiftCalendar shifts, TimeProvider time, PageSnapshots snapshots) =>
        snapshots.GetAsync(Key(context), () => YieldPageAsync(context, source, shifts, time), context.RequestAborted);

    private static async Task<IResult> YieldPageAsync(HttpContext context, IResultsSource source, ShiftCalendar shifts, TimeProvider time)
    {
        // Without dates, the last days only: the source reads that window (SQL), never every run stored.
        return await Guarded(context, source, time, "Yield", "/yield", async (filters, products, query) =>
        {
            var data = await source.LoadAsync(query with { GroupBy = ReportGrouping.Day }, withReadings: false, context.RequestAborted).ConfigureAwait(false);
            var report = ReportBuilder.Build(data, query, time);
            var form = filters.Form("/yield", products) + (filters.IsDefaultWindow ? YieldPage.DefaultWindowNote(filters) : string.Empty);
            return YieldPage.Main(form, report, YieldPage.ByShift(data.Runs, shifts), Html.Query(filters.Pairs()));
        }, filters => filters.WithDefaultWindow(time.GetUtcNow())).ConfigureAwait(false);
    }

    private static Task<IResult> ParetoSvgAsync(HttpContext context, IResultsSource source, TimeProvider time, PageSnapshots snapshots) =>
        snapshots.GetAsync(Key(context), () => ParetoSvgMadeAsync(context, source, time), context.RequestAborted);

    private static async Task<IResult> ParetoSvgMadeAsync(HttpContext context, IResultsSource source, TimeProvider time)
    {
        var (query, _) = PageFilters.Read(context.Request.Query).WithDefaultWindow(time.GetUtcNow())
            .ToQuery(await source.ReadProductsAsync(context.RequestAborted).ConfigureAwait(false));
        if (query is null)
        {
            return Results.BadRequest();
        }

        var data = await source.LoadAsync(query, withReadings: false, context.RequestAborted).ConfigureAwait(false);
        var report = ReportBuilder.Build(data, query, time);
        return Svg(SvgChart.Render(ParetoChart.Create(report.Yield.FailurePareto)));
    }

    private static async Task<IResult> CapabilityAsync(HttpContext context, IResultsSource source, TimeProvider time)
    {
        return await Guarded(context, source, time, "Capability", "/capability", async (filters, products, query) =>
        {
            var data = await source.LoadAsync(query, withReadings: true, context.RequestAborted).ConfigureAwait(false);
            var report = ReportBuilder.Build(data, query, time);
            return CapabilityPage.Overview(filters.Form("/capability", products), report, Html.Query(filters.Pairs()));
        }).ConfigureAwait(false);
    }

    private static async Task<IResult> ReadingAsync(HttpContext context, IResultsSource source, TimeProvider time)
    {
        var name = context.Request.Query["reading"].ToString();
        return await Guarded(context, source, time, "Capability of " + name, "/capability", async (filters, products, query) =>
        {
            var report = await ReadingReportAsync(source, query, name, time, context.RequestAborted).ConfigureAwait(false);
            var form = filters.Form("/capability/reading", products, "reading", name);
            if (report.Readings.Count == 0)
            {
                return form + PageFrame.Notice($"No reading named '{name}' in the selected runs.");
            }

            var chartQuery = Html.Query([.. filters.Pairs(), ("reading", name)]);
            return CapabilityPage.Reading(form, report, report.Readings[0], chartQuery);
        }).ConfigureAwait(false);
    }

    private static async Task<IResult> ReadingSvgAsync(HttpContext context, IResultsSource source, TimeProvider time, Func<ReadingStatistics, ScottPlot.Plot?> chart)
    {
        var name = context.Request.Query["reading"].ToString();
        var (query, _) = PageFilters.Read(context.Request.Query).ToQuery(await source.ReadProductsAsync(context.RequestAborted).ConfigureAwait(false));
        if (query is null || name.Length == 0)
        {
            return Results.BadRequest();
        }

        var report = await ReadingReportAsync(source, query, name, time, context.RequestAborted).ConfigureAwait(false);
        return report.Readings.Count == 0 || chart(report.Readings[0]) is not { } plot ? Results.NotFound() : Svg(SvgChart.Render(plot));
    }

    private static async Task<QualityReport> ReadingReportAsync(IResultsSource source, ReportQuery query, string name, TimeProvider time, CancellationToken ct)
    {
        var one = query with { ReadingNames = [name] };
        var data = await source.LoadAsync(one, withReadings: true, ct).ConfigureAwait(false);
        return ReportBuilder.Build(data, one, time);
    }

    private static async Task<IResult> UnitsAsync(HttpContext context, IResultsSource source, TimeProvider time)
    {
        var prefix = context.Request.Query["serial"].ToString().Trim();
        if (prefix.Length == 0)
        {
            return Page(PageFrame.Page("Unit history", "/units", HistoryPage.Search(null, null), Footer(source, time)));
        }

        try
        {
            var matches = await source.FindSerialsAsync(prefix, HistoryPage.MaxMatches, context.RequestAborted).ConfigureAwait(false);
            if (matches.Count == 1 && matches[0] == prefix)
            {
                return Results.Redirect("/units/" + Uri.EscapeDataString(prefix));
            }

            return Page(PageFrame.Page("Unit history", "/units", HistoryPage.Search(prefix, matches), Footer(source, time)));
        }
        catch (ResultStoreException ex)
        {
            return Problem(context, source, time, "Unit history", "/units", ex);
        }
    }

    private static async Task<IResult> UnitAsync(HttpContext context, string serial, IResultsSource source, TimeProvider time)
    {
        try
        {
            var runs = await source.ReadHistoryAsync(serial, context.RequestAborted).ConfigureAwait(false);
            var page = PageFrame.Page("Unit " + serial, "/units", HistoryPage.History(serial, runs), Footer(source, time));
            return runs.Count == 0 ? Results.Content(page, "text/html; charset=utf-8", Encoding.UTF8, StatusCodes.Status404NotFound) : Page(page);
        }
        catch (ResultStoreException ex)
        {
            return Problem(context, source, time, "Unit " + serial, "/units", ex);
        }
    }

    /// <summary>Reads the filters, then renders; bad filters and unreadable results become a page that says why.</summary>
    private static async Task<IResult> Guarded(
        HttpContext context,
        IResultsSource source,
        TimeProvider time,
        string title,
        string section,
        Func<PageFilters, IReadOnlyList<Storage.Sqlite.ProductSequence>, ReportQuery, Task<string>> render,
        Func<PageFilters, PageFilters>? defaults = null)
    {
        try
        {
            var filters = PageFilters.Read(context.Request.Query);
            filters = defaults?.Invoke(filters) ?? filters;
            var products = await source.ReadProductsAsync(context.RequestAborted).ConfigureAwait(false);
            var (query, problems) = filters.ToQuery(products);
            if (query is null)
            {
                var main = filters.Form(section, products) + string.Concat(problems.Select(PageFrame.Notice)) + filters.SequenceChoices(context.Request.Path, context.Request.Query, products);
                return Results.Content(PageFrame.Page(title, section, main, Footer(source, time)), "text/html; charset=utf-8", Encoding.UTF8, StatusCodes.Status400BadRequest);
            }

            return Page(PageFrame.Page(title, section, await render(filters, products, query).ConfigureAwait(false), Footer(source, time)));
        }
        catch (ResultStoreException ex)
        {
            return Problem(context, source, time, title, section, ex);
        }
    }

    private static IResult Problem(HttpContext context, IResultsSource source, TimeProvider time, string title, string section, ResultStoreException ex)
    {
        var logger = context.RequestServices.GetRequiredService<ILoggerFactory>().CreateLogger(typeof(WebPageEndpoints));
        AccessLog.ReadFailed(logger, context.Request.Path, ex.Message);
        var page = PageFrame.Page(title, section, PageFrame.Notice("The results could not be read: " + ex.Message), Footer(source, time));
        return Results.Content(page, "text/html; charset=utf-8", Encoding.UTF8, StatusCodes.Status503ServiceUnavailable);
    }

    private static string Key(HttpContext context) => context.Request.Path.Value + context.Request.QueryString.Value;

    private static string Footer(IResultsSource source, TimeProvider time) =>
        $"LineTest, read-only · {source.Description} · page made {Html.Utc(time.GetUtcNow())}";

    private static IResult Page(string html) => Results.Content(html, "text/html; charset=utf-8", Encoding.UTF8);

    private static IResult Svg(string svg) => Results.Content(svg, "image/svg+xml; charset=utf-8", Encoding.UTF8);

    private sealed record LiveTiles([property: JsonPropertyName("html")] string Html, [property: JsonPropertyName("at")] string At);
}
