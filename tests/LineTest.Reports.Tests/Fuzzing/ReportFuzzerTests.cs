using CsCheck;
using LineTest.Reports.Fuzzing;
using LineTest.Reports.Tests.Support;
using LineTest.TestSupport;

namespace LineTest.Reports.Tests.Fuzzing;

/// <summary>
/// Property: any mutated readings CSV or damaged results database gives a report or a refusal with a reason, never an
/// exception the command would print as a stack trace, and within 10 s. Bounded for CI; the large runs go through
/// <c>linetest report --fuzz N</c> (figures in docs/reliability.md).
/// </summary>
[Trait("Category", "Fuzz")]
public sealed class ReportFuzzerTests
{
    private const string Readings =
        "serial,name,value,unit,low,high,time,station,slot,lot,sequence_id,sequence_revision,operator\n" +
        "A1,offset,2.5,V,0,5,2025-03-04T06:00:00Z,ST-01,1,L1,seq-a,1,ann\n" +
        "A1,leak,1.1,uA,,2,2025-03-04T06:00:00Z,ST-01,1,L1,seq-a,1,ann\n" +
        "A2,offset,2.4,V,0,5,2025-03-04T06:10:00Z,ST-01,2,L1,seq-a,1,ann\n" +
        "A2,leak,0.9,uA,,2,2025-03-04T06:10:00Z,ST-01,2,L1,seq-a,1,ann\n" +
        "B1,offset,2.6,V,0,5,2025-03-04T06:20:00Z,ST-02,1,L2,seq-b,2,bo\n" +
        "B1,leak,1.9,uA,,2,2025-03-04T06:20:00Z,ST-02,1,L2,seq-b,2,bo\n" +
        "A1,offset,2.45,V,0,5,2025-03-04T07:00:00Z,ST-01,3,L1,seq-a,1,ann\n";

    [Fact]
    public void RunCsv_MutatedReadings_ReportOrRefuseNeverCrash()
    {
        Gen.Int.Select(Gen.Bool).Sample((seed, skip) =>
        {
            var text = ReportFuzzer.MutateCsv(Readings, new Random(seed));
            var started = System.Diagnostics.Stopwatch.GetTimestamp();
            var outcome = ReportFuzzer.RunCsv(text, skip, out var crash);
            Assert.True(outcome != FuzzOutcome.Crashed, $"{crash}\n--- input ---\n{text}");
            Assert.True(System.Diagnostics.Stopwatch.GetElapsedTime(started) < ReportFuzzer.Limit);
        }, iter: 300);
    }

    [Fact]
    public async Task RunDatabase_DamagedDatabases_ReportOrRefuseNeverCrash()
    {
        var original = await Synthetic.CreateAsync(runs: 40, seed: 7);
        var summary = ReportFuzzer.FuzzDatabase(original, iterations: 30, seed: 11);

        Assert.True(summary.Crashed == 0, summary.FirstCrash);
        Assert.Equal(0, summary.OverTenSeconds);
        Assert.Equal(30, summary.Reported + summary.Refused);
        Assert.True(summary.Refused > 0 && summary.Reported > 0, "the mutations reach both outcomes");
    }

    [Fact]
    public void RunCsv_LowLimitOfMinusMaxDouble_HistogramPageIsWritten()
    {
        // Found by the CSV property: a low limit of -1.7976931348623157e308 made the histogram's axis (limits plus a
        // margin) overflow, and the chart library threw while drawing the HTML page.
        var text = Readings.Replace("B1,leak,1.9,uA,,2,", "B1,leak,1.9,uA,-1.7976931348623157e308,2,", StringComparison.Ordinal);
        var loaded = LineTest.Reports.Loading.CsvReadingsLoader.Load(new StringReader(text), "limits.csv", LineTest.Reports.Loading.ReportQuery.All, skipBadRows: false);
        var report = LineTest.Reports.Building.ReportBuilder.Build(loaded.Data!, LineTest.Reports.Loading.ReportQuery.All, TimeProvider.System);

        var html = LineTest.Reports.Html.HtmlReportWriter.ToHtml(report);

        Assert.Contains("Histogram of ", html, StringComparison.Ordinal);
    }

    [Fact]
    public void MutateCsv_SameSeed_SameInput()
    {
        Assert.Equal(ReportFuzzer.MutateCsv(Readings, new Random(5)), ReportFuzzer.MutateCsv(Readings, new Random(5)));
        Assert.NotEqual(Readings, ReportFuzzer.MutateCsv(Readings, new Random(5)));
    }
}
