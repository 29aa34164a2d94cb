using System.Text.Json;
using LineTest.Reports.Building;
using LineTest.Reports.Json;
using LineTest.Reports.Loading;
using LineTest.Reports.Tests.Support;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Reports.Tests.Json;

public sealed class ReportJsonWriterTests
{
    private static async Task<JsonDocument> SmallJsonAsync(ReportGrouping grouping = ReportGrouping.None)
    {
        var directory = await SmallLine.CreateAsync();
        var query = new ReportQuery { GroupBy = grouping };
        var report = ReportBuilder.Build(await ResultsLoader.LoadAsync([directory], query), query, new FakeTimeProvider());
        return JsonDocument.Parse(ReportJsonWriter.ToJson(report));
    }

    [Fact]
    public void Write_ToATextWriter_SameTextAsToJsonForAReportWrittenInManyPieces()
    {
        // 100,000 runs of a noisy reading (hundreds of run-rule signals) and texts of several bytes per character:
        // the writer passes the JSON on in 64 KiB pieces, and the text writer must get exactly ToJson's text.
        var data = new ReportData();
        data.AddSource("Prüfstand Ω-7, Linie 3");
        var series = data.Series("ctp40a-dac", "verify.Δ", "°C");
        var start = new DateTimeOffset(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);
        var random = new Random(40);
        for (var i = 0; i < 100_000; i++)
        {
            var run = data.Runs.Add($"CTP40-Ä{i:D5}", start.AddMinutes(i), Core.Results.Verdict.Pass, "ST-Ü1", 1 + (i % 4), "LOT-ß", "ctp40a-dac", 3, null, null);
            series.Add(run, random.NextDouble() + random.NextDouble() + random.NextDouble() - 1.5, "°C", -2.5, 2.5);
        }

        var report = ReportBuilder.Build(data, ReportQuery.All, new FakeTimeProvider());
        var expected = ReportJsonWriter.ToJson(report);
        using var text = new StringWriter();

        ReportJsonWriter.Write(report, text);

        Assert.True(expected.Length > 2 << 16, $"{expected.Length} characters: not enough to be written in several pieces");
        Assert.Equal(expected, text.ToString());
    }

    private static string[] Keys(JsonElement element) => [.. element.EnumerateObject().Select(p => p.Name)];

    [Fact]
    public async Task Write_KeySet_IsPinned()
    {
        using var json = await SmallJsonAsync();
        var root = json.RootElement;

        // The contract of docs/report-json.md: changing a key breaks consumers' scripts.
        Assert.Equal(
            ["title", "generatedUtc", "sources", "filters", "yield", "pareto", "errors", "readings", "slots", "groups", "dailyYield", "skippedRows", "signalLegend"],
            Keys(root));
        Assert.Equal(
            ["runs", "units", "firstPassYield", "finalYield", "retestRate", "errorRate", "passRuns", "failRuns", "errorRuns"],
            Keys(root.GetProperty("yield")));
        Assert.Equal(
            [
                "name", "unit", "low", "high", "limitsChanged", "n", "missing", "mean", "stdevOverall", "stdevWithin",
                "cp", "cpLower95", "cpUpper95", "cpk", "cpkLower95", "cpkUpper95", "pp", "ppk", "ppmObserved", "ppmExpected",
                "adStatistic", "normalityP", "sequence", "covers", "nonNormal", "withinDf", "percentile", "controlLimits", "signals", "notes",
            ],
            Keys(root.GetProperty("readings")[0]));
        Assert.Equal(["name", "failures", "fraction", "cumulativeFraction"], Keys(root.GetProperty("pareto")[0]));
        Assert.Equal(["name", "sequence", "unit", "f", "p", "dfBetween", "dfWithin", "grandMean", "offsets", "note"], Keys(root.GetProperty("slots")[0]));
        Assert.Equal(["slot", "n", "mean", "offset"], Keys(root.GetProperty("slots")[0].GetProperty("offsets")[0]));
    }

    [Fact]
    public async Task Write_OneSidedReading_WritesExplicitNulls()
    {
        using var json = await SmallJsonAsync();
        var leak = json.RootElement.GetProperty("readings").EnumerateArray().Single(r => r.GetProperty("name").GetString() == "leak");

        Assert.Equal(JsonValueKind.Null, leak.GetProperty("cp").ValueKind);
        Assert.Equal(JsonValueKind.Null, leak.GetProperty("pp").ValueKind);
        Assert.Equal(JsonValueKind.Null, leak.GetProperty("low").ValueKind);
        Assert.Equal(JsonValueKind.Number, leak.GetProperty("cpk").ValueKind);
        Assert.Equal(5.0, leak.GetProperty("high").GetDouble());
    }

    [Fact]
    public async Task Write_Yield_HoldsHandCountedFigures()
    {
        using var json = await SmallJsonAsync();
        var y = json.RootElement.GetProperty("yield");

        Assert.Equal(6, y.GetProperty("runs").GetInt32());
        Assert.Equal(0.5, y.GetProperty("firstPassYield").GetDouble());
        Assert.Equal(0.75, y.GetProperty("finalYield").GetDouble());
        Assert.Equal("offset", json.RootElement.GetProperty("pareto")[0].GetProperty("name").GetString());
        Assert.Equal(2, json.RootElement.GetProperty("pareto")[0].GetProperty("failures").GetInt32());
    }

    [Fact]
    public async Task Write_Grouped_AddsGroupsWithYieldAndReadings()
    {
        using var json = await SmallJsonAsync(ReportGrouping.Slot);
        var groups = json.RootElement.GetProperty("groups");

        Assert.Equal("slot", groups.GetProperty("by").GetString());
        Assert.Equal(["key", "yield", "readings"], Keys(groups.GetProperty("items")[0]));
        Assert.Equal(2, groups.GetProperty("items").GetArrayLength());
    }

    [Fact]
    public async Task Write_Ungrouped_GroupsIsNull()
    {
        using var json = await SmallJsonAsync();

        Assert.Equal(JsonValueKind.Null, json.RootElement.GetProperty("groups").ValueKind);
    }
}
