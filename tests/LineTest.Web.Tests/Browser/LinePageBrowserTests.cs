using System.Globalization;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.TestSupport;
using LineTest.Reports.Loading;
using LineTest.Web.Access;
using LineTest.Web.Data;
using LineTest.Web.Hosting;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Logging.Abstractions;
using OpenQA.Selenium;
using OpenQA.Selenium.Chrome;
using Xunit.Abstractions;

namespace LineTest.Web.Tests.Browser;

/// <summary>
/// The page in a real browser (headless Chromium through chromedriver) on the real server (Kestrel on loopback)
/// while the station's simulated shift writes to the results folder.
/// </summary>
public sealed class LinePageBrowserTests(ITestOutputHelper output)
{
    private const int Width = 1280;
    private const int Height = 800;

    [BrowserFact]
    public async Task Page_WhileADemoWrites_CountsRiseLive_SerialHistoryAndCapabilityOpen()
    {
        Assert.True(BrowserFactAttribute.Missing() is null, $"CI=true but {BrowserFactAttribute.Missing()} is missing; .ci/run installs chromium and chromium-driver");
        var results = Directory.CreateTempSubdirectory("linetest-browser-").FullName;
        var shots = Path.Combine(Path.GetTempPath(), "linetest-browser-shots");
        Directory.CreateDirectory(shots);

        // A demo lays its shift out in the past (an empty folder's first shift starts at 06:00 UTC a week back, so that
        // no run is stored in the future): the page's clock is moved to that day's afternoon, with one 24-hour shift
        // from 06:00, so the demo's runs land in the shift the tile shows while the page's timers run in real time.
        var wallNow = TimeProvider.System.GetUtcNow();
        var demoStart = new DateTimeOffset((wallNow - TimeSpan.FromDays(7)).UtcDateTime.Date.AddHours(6), TimeSpan.Zero);
        var pageClock = new ShiftedClock(demoStart + TimeSpan.FromHours(10) - wallNow);
        var options = new WebPageOptions { RefreshSeconds = 0.25 };
        var setup = new WebPageSetup(ListenAddress.Parse("127.0.0.1:0", out _)!, options, new SqliteFolderSource([results]))
        {
            Loggers = NullLoggerFactory.Instance,
            Time = pageClock,
            Shifts = new NamedShifts([("day", new TimeOnly(6, 0))]),
        };
        await using var app = WebPageApp.Create(setup);
        await app.StartAsync();
        var url = WebPageApp.Addresses(app).Single();

        using var driver = StartBrowser();
        driver.Navigate().GoToUrl(url + "/");
        Assert.Equal("Line now · LineTest", driver.Title);
        ((IJavaScriptExecutor)driver).ExecuteScript("window.lineTestMarker = 'loaded once';");
        Assert.Equal(0, ShiftRuns(driver));

        // The demo: the station's simulated shift, paced so the page sees the counts rise run by run.
        using var stop = new CancellationTokenSource(TimeSpan.FromMinutes(3));
        var demo = Task.Run(() => DemoShift(results).RunAsync(_ => Thread.Sleep(300), stop.Token));
        var seen = new List<int> { 0 };
        while (!demo.IsCompleted || seen[^1] < 16)
        {
            var runs = ShiftRuns(driver);
            if (runs != seen[^1])
            {
                seen.Add(runs);
            }

            if (demo.IsCompleted && seen[^1] >= 16)
            {
                break;
            }

            Assert.False(stop.IsCancellationRequested, "the counts did not reach 16; seen " + string.Join(", ", seen));
            await Task.Delay(100);
            if (seen.Count == 4)
            {
                Save(driver, shots, "line-now.png");
            }
        }

        var summary = await demo;
        output.WriteLine("runs seen on the tile: " + string.Join(", ", seen));
        Assert.Equal(16, summary.Units);
        Assert.True(seen.Count >= 4, "the tile should rise several times while the demo writes; seen " + string.Join(", ", seen));
        Assert.Equal(seen.Order(), seen);
        Assert.Equal("loaded once", ((IJavaScriptExecutor)driver).ExecuteScript("return window.lineTestMarker;"));
        Assert.Equal("ST-01", driver.FindElement(By.CssSelector(".tile h2")).Text);

        // Search a serial by its beginning and open its history.
        driver.FindElement(By.LinkText("Unit history")).Click();
        var search = driver.FindElement(By.Name("serial"));
        search.SendKeys("CTP40A-");
        search.Submit();
        var first = driver.FindElements(By.CssSelector("ul.serials a"))[0];
        var serial = first.Text;
        first.Click();
        Assert.Equal("Unit " + serial, driver.FindElement(By.TagName("h1")).Text);
        Assert.Matches("^[0-9a-f]{64}$", driver.FindElement(By.CssSelector("code.hash")).Text);
        Assert.NotEmpty(driver.FindElements(By.CssSelector("table.readings tbody tr")));
        Save(driver, shots, "unit-history.png");

        // A capability page: statistics and both charts drawn.
        driver.Navigate().GoToUrl(url + "/capability?product=CTP-40A");
        driver.FindElement(By.LinkText("verify.error")).Click();
        Assert.Equal("Capability of verify.error", driver.FindElement(By.TagName("h1")).Text);
        var charts = driver.FindElements(By.CssSelector("img.chart"));
        Assert.Equal(2, charts.Count);
        foreach (var chart in charts)
        {
            Assert.True(WaitFor(() => Convert.ToInt64(((IJavaScriptExecutor)driver).ExecuteScript("return arguments[0].complete ? arguments[0].naturalWidth : 0;", chart), CultureInfo.InvariantCulture) > 0), "a chart did not load");
        }

        Assert.True(FitsWidth(driver), "the capability page scrolls sideways at 1280×800");
        Save(driver, shots, "capability.png");

        // On a tablet (portrait, 820×1180) the line page still fits its width.
        Viewport(driver, 820, 1180);
        driver.Navigate().GoToUrl(url + "/");
        Assert.True(FitsWidth(driver), "the line page scrolls sideways on a tablet");
        Save(driver, shots, "line-now-tablet.png", 820, 1180);
        output.WriteLine("screenshots in " + shots);
        await app.StopAsync();
    }

    private static int ShiftRuns(IWebDriver driver)
    {
        for (var attempt = 0; ; attempt++)
        {
            try
            {
                var tiles = driver.FindElements(By.CssSelector("dd[data-key='shift-runs']"));
                return tiles.Count == 0 ? 0 : int.Parse(tiles[0].Text, NumberStyles.AllowThousands, CultureInfo.InvariantCulture);
            }
            catch (StaleElementReferenceException) when (attempt < 5)
            {
                // The tiles were replaced by a live update between finding and reading.
            }
        }
    }

    private static bool WaitFor(Func<bool> condition)
    {
        for (var i = 0; i < 100; i++)
        {
            if (condition())
            {
                return true;
            }

            Thread.Sleep(100);
        }

        return false;
    }

    private static void Save(IWebDriver driver, string folder, string name, int width = Width, int height = Height)
    {
        var png = ((ITakesScreenshot)driver).GetScreenshot().AsByteArray;
        Assert.Null(ScreenshotCheck.WhyBlank(png, width, height));
        File.WriteAllBytes(Path.Combine(folder, name), png);
    }

    /// <summary>Sets the page's viewport exactly (the window size of headless Chromium includes its frame).</summary>
    private static void Viewport(ChromeDriver driver, int width, int height) =>
        driver.ExecuteCdpCommand("Emulation.setDeviceMetricsOverride", new Dictionary<string, object?>
        {
            ["width"] = width,
            ["height"] = height,
            ["deviceScaleFactor"] = 1,
            ["mobile"] = false,
        });

    /// <summary>True when the page fits the viewport's width (no sideways scrolling).</summary>
    private static bool FitsWidth(IWebDriver driver) =>
        (bool)((IJavaScriptExecutor)driver).ExecuteScript("return document.documentElement.scrollWidth <= window.innerWidth;")!;

    private static SimulatedShift DemoShift(string results)
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null);
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture.Value, TextWriter.Null);
        Assert.True(fixture.IsSuccess && sequence.IsSuccess);
        return new SimulatedShift(
            new ShiftOptions { Fixture = fixture.Value, Sequence = sequence.Value, SequenceSha256 = sequence.Sha256, Units = 16, ResultsDirectory = results, Lot = "L-2612-07" },
            NullLoggerFactory.Instance);
    }

    private static ChromeDriver StartBrowser()
    {
        var service = ChromeDriverService.CreateDefaultService(Path.GetDirectoryName(BrowserFactAttribute.ChromeDriver)!, Path.GetFileName(BrowserFactAttribute.ChromeDriver));
        service.HideCommandPromptWindow = true;
        service.SuppressInitialDiagnosticInformation = true;
        var options = new ChromeOptions { BinaryLocation = BrowserFactAttribute.Chromium };
        options.AddArguments(
            "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", "--user-data-dir=" + Directory.CreateTempSubdirectory("linetest-chromium-").FullName,
            $"--window-size={Width},{Height}");
        var driver = new ChromeDriver(service, options, TimeSpan.FromSeconds(60));
        Viewport(driver, Width, Height);
        return driver;
    }
}
