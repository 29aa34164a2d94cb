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

        var start = new ProcessStartInfo(ChromiumFactAttribute.ChromiumPath)
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
        };
        foreach (var argument in new[]
        {
            "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", $"--user-data-dir={Path.Combine(folder, "profile")}",
            $"--screenshot={shot}", "--window-size=1280,4000", "file://" + page,
        })
        {
            start.ArgumentList.Add(argument);
        }

        using (var browser = Process.Start(start)!)
        {
            var stderr = browser.StandardError.ReadToEndAsync();
            _ = browser.StandardOutput.ReadToEndAsync();
            using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(90));
            await browser.WaitForExitAsync(cancel.Token);
            Assert.True(File.Exists(shot), "no screenshot; chromium said: " + await stderr);
        }

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

    [GeneratedRegex("data:image/png;base64,([A-Za-z0-9+/=]+)")]
    private static partial Regex PngImage();
}
