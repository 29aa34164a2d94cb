using System.Diagnostics;
using System.Text.RegularExpressions;
using LineTest.Reports.Building;
using LineTest.Reports.Html;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using LineTest.TestSupport;
using Microsoft.Extensions.Time.Testing;
using SkiaSharp;

namespace LineTest.Reports.Tests.Html;

public sealed partial class HtmlReportWriterTests
{
    private static async Task<(QualityReport Report, string Html)> PageAsync(int runs = 160)
    {
        var directory = await Synthetic.CreateAsync(runs, seed: 11);
        var report = ReportBuilder.Build(await ResultsLoader.LoadAsync([directory], ReportQuery.All), ReportQuery.All, new FakeTimeProvider(new DateTimeOffset(2025, 3, 5, 8, 0, 0, TimeSpan.Zero)));
        return (report, HtmlReportWriter.ToHtml(report));
    }

    [Fact]
    public async Task Write_Page_IsSelfContainedWithAnImagePerChart()
    {
        var (report, html) = await PageAsync();

        Assert.DoesNotContain("http://", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("https://", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<link", html, StringComparison.OrdinalIgnoreCase);

        // Pareto + daily yield trend (runs span two days) + a histogram and a control chart per reading.
        Assert.True(report.DailyYield.Count >= 2);
        var expectedCharts = 1 + 1 + (2 * report.Readings.Count);
        Assert.Equal(expectedCharts, PngImage().Matches(html).Count);
        Assert.Contains("LineTest quality report", html, StringComparison.Ordinal);
        Assert.Contains("Made:", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Write_Page_HasPrintRulesForA4()
    {
        var (_, html) = await PageAsync(40);

        Assert.Contains("@page { size: A4", html, StringComparison.Ordinal);
        Assert.Contains("page-break-inside: avoid", html, StringComparison.Ordinal);
        Assert.Contains("max-width: 100%", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Write_ImagesDecodeAsPngs()
    {
        var (_, html) = await PageAsync(60);

        foreach (Match match in PngImage().Matches(html))
        {
            using var bitmap = SKBitmap.Decode(Convert.FromBase64String(match.Groups[1].Value));
            Assert.NotNull(bitmap);
            Assert.True(bitmap.Width >= HtmlReportWriter.ChartWidth, $"chart only {bitmap.Width} px wide");
        }
    }

    [ChromiumFact]
    public async Task Write_Page_RendersInHeadlessChromium()
    {
        var (_, html) = await PageAsync();
        var folder = Some.TempDirectory();
        var page = Path.Combine(folder, "report.html");
        var shot = Path.Combine(folder, "report.png");
        await File.WriteAllTextAsync(page, html);

        var (_, stderr) = await ChromiumAsync(folder, $"--screenshot={shot}", "--window-size=1280,4000", "file://" + page);
        Assert.True(File.Exists(shot), "no screenshot; chromium said: " + stderr);

        using var bitmap = SKBitmap.Decode(shot);
        Assert.Equal((1280, 4000), (bitmap.Width, bitmap.Height));

        // Not blank: the luminance varies and a fair share of pixels is not background.
        double sum = 0, sumSquares = 0;
        var inked = 0;
        var samples = 0;
        for (var y = 0; y < bitmap.Height; y += 4)
        {
            for (var x = 0; x < bitmap.Width; x += 4)
            {
                var c = bitmap.GetPixel(x, y);
                var luminance = (0.2126 * c.Red) + (0.7152 * c.Green) + (0.0722 * c.Blue);
                sum += luminance;
                sumSquares += luminance * luminance;
                samples++;
                if (luminance < 200)
                {
                    inked++;
                }
            }
        }

        var mean = sum / samples;
        var variance = (sumSquares / samples) - (mean * mean);
        Assert.True(variance > 100, $"screenshot looks blank (luminance variance {variance:F1})");
        Assert.True(inked > samples / 100, $"only {inked} of {samples} sampled pixels are dark");
    }

    // Regression (report fuzzing): a readings CSV with a value of -1.797E308 among ordinary ones made the run rules
    // throw on an infinite σ and the histogram's axis overflow to -∞ (ScottPlot refused it), so the page was not
    // written. Now the control chart is reported as not computed and the histogram is left out.
    [Fact]
    public void Write_ValueNearTheLargestDouble_WritesThePage()
    {
        const string csv =
            "serial,name,value,unit,low,high\n" +
            "A1,offset,2.5,V,0,5\n" +
            "A2,offset,-1.7976931348623157e308,V,0,5\n" +
            "B1,offset,2.6,V,0,5\n" +
            "A3,offset,2.45,V,0,5\n";
        var loaded = CsvReadingsLoader.Load(new StringReader(csv), "readings.csv", ReportQuery.All, skipBadRows: false);
        Assert.True(loaded.IsUsable, loaded.FileError);
        var report = ReportBuilder.Build(loaded.Data!, ReportQuery.All, new FakeTimeProvider(new DateTimeOffset(2025, 3, 5, 8, 0, 0, TimeSpan.Zero)));

        var html = HtmlReportWriter.ToHtml(report);

        Assert.Contains("offset", html, StringComparison.Ordinal);
        Assert.Null(report.Readings.Single().Chart);
    }

    // Regression: the readings table (twelve columns, long reading names, the products each figure covers) ran past
    // the page column on screen and off the paper in print. Laid out by the browser itself: every table must sit inside
    // the column of main, on a 1280 px screen (a 960 px column) and with the print rules on a sheet of A4 less the
    // 12 mm side margins of the page's @page rule (186 mm = 703 CSS px), with cells no smaller than 9 px.
    [ChromiumFact]
    public async Task Write_WideReadingsTable_FitsThePageColumnOnScreenAndInPrint()
    {
        var directory = await Synthetic.CreateAsync(120, seed: 5, mixedProducts: true);
        var query = ReportQuery.All with { GroupBy = ReportGrouping.Lot };
        var report = ReportBuilder.Build(await ResultsLoader.LoadAsync([directory], query), query, new FakeTimeProvider(new DateTimeOffset(2025, 3, 5, 8, 0, 0, TimeSpan.Zero)));
        Assert.True(report.Readings.Select(r => r.SequenceId).Distinct().Count() > 1, "the page should show two products' readings");
        var html = HtmlReportWriter.ToHtml(report);
        var folder = Some.TempDirectory();

        foreach (var (print, width) in new[] { (false, 1280), (true, 703) })
        {
            var page = Path.Combine(folder, print ? "print.html" : "screen.html");
            await File.WriteAllTextAsync(page, html.Replace("</body>", LayoutProbe(print) + "</body>", StringComparison.Ordinal));
            var (dom, stderr) = await ChromiumAsync(folder, "--dump-dom", $"--window-size={width},2000", "file://" + page);
            var verdict = LayoutVerdict().Match(dom);
            Assert.True(verdict.Success, "the layout probe did not run; chromium said: " + stderr);
            Assert.Equal((print ? "print: " : "screen: ") + "fits", System.Net.WebUtility.HtmlDecode(verdict.Groups[1].Value));
        }
    }

    /// <summary>
    /// A script (for the test copy only; the report itself has none) that measures the laid-out page and writes what
    /// does not fit into body's data-layout attribute. For print it turns the page's print rules on for the screen.
    /// </summary>
    private static string LayoutProbe(bool print) => $$"""
        <script>
        (function () {
          var print = {{(print ? "true" : "false")}};
          if (print) {
            for (var s = 0; s < document.styleSheets.length; s++) {
              var rules = document.styleSheets[s].cssRules;
              for (var r = 0; r < rules.length; r++) {
                if (rules[r].media && rules[r].media.mediaText.indexOf('print') >= 0) { rules[r].media.mediaText = 'all'; }
              }
            }
          }
          var main = document.querySelector('main');
          var box = main.getBoundingClientRect();
          var style = getComputedStyle(main);
          var left = box.left + parseFloat(style.paddingLeft), right = box.right - parseFloat(style.paddingRight);
          var problems = [];
          var tables = document.querySelectorAll('table');
          for (var i = 0; i < tables.length; i++) {
            var t = tables[i].getBoundingClientRect();
            if (t.right > right + 0.5 || t.left < left - 0.5) {
              problems.push('table ' + (i + 1) + ' (' + tables[i].rows[0].cells[0].textContent + ') spans ' + Math.round(t.left) + '-' + Math.round(t.right) + ' px, the column ' + Math.round(left) + '-' + Math.round(right) + ' px');
            }
          }
          var cells = document.querySelectorAll('td, th');
          for (var c = 0; c < cells.length; c++) {
            var size = parseFloat(getComputedStyle(cells[c]).fontSize);
            if (size < 9) { problems.push('cell "' + cells[c].textContent + '" in ' + size + ' px type'); break; }
          }
          if (document.documentElement.scrollWidth > document.documentElement.clientWidth) {
            problems.push('the page scrolls sideways (' + document.documentElement.scrollWidth + ' px)');
          }
          document.body.setAttribute('data-layout', (print ? 'print: ' : 'screen: ') + (problems.length ? problems.join('; ') : 'fits'));
        })();
        </script>

        """;

    private static async Task<(string Stdout, string Stderr)> ChromiumAsync(string folder, params string[] arguments)
    {
        var start = new ProcessStartInfo(ChromiumFactAttribute.ChromiumPath)
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
        };
        foreach (var argument in new[]
        {
            "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", $"--user-data-dir={Path.Combine(folder, "profile")}",
        }.Concat(arguments))
        {
            start.ArgumentList.Add(argument);
        }

        using var browser = Process.Start(start)!;
        var stderr = browser.StandardError.ReadToEndAsync();
        var stdout = browser.StandardOutput.ReadToEndAsync();
        using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(90));
        await browser.WaitForExitAsync(cancel.Token);
        return (await stdout, await stderr);
    }

    [GeneratedRegex("data-layout=\"([^\"]*)\"")]
    private static partial Regex LayoutVerdict();

    [GeneratedRegex("data:image/png;base64,([A-Za-z0-9+/=]+)")]
    private static partial Regex PngImage();
}
