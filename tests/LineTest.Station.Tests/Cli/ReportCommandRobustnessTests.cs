using System.Text.Json;
using LineTest.Station.Cli;
using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Cli;

/// <summary>Regression tests: reports that crashed on thin or damaged data now finish, or refuse with exit 2 and a reason.</summary>
public sealed class ReportCommandRobustnessTests
{
    private static async Task<string> DemoAsync(int units)
    {
        var results = Some.TempDirectory();
        var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", units.ToString(System.Globalization.CultureInfo.InvariantCulture), "--results", results, "--json");
        Assert.True(exit == 0, error);
        return results;
    }

    private static void Execute(string results, string sql)
    {
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA ignore_check_constraints = ON; " + sql;
        command.ExecuteNonQuery();
    }

    [Fact]
    public async Task Report_DemoWithOneUnitThenHtml_WritesThePage()
    {
        // Regression: `demo --units 1` then `report --html` crashed (a reading seen once has no histogram bins).
        var results = await DemoAsync(1);
        var html = Path.Combine(Some.TempDirectory(), "one.html");

        var (exit, output, error) = await CliRunner.RunAsync("report", "--results", results, "--html", html);

        Assert.True(exit == ExitCodes.Done, error);
        Assert.Contains("<html", File.ReadAllText(html), StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", output + error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Report_ReadingOf1e160_EveryFormatFinishes()
    {
        // Regression: a reading of 1e160 crashed every format (its square overflowed).
        var results = await DemoAsync(4);
        Execute(results, "UPDATE readings SET value = 1e160 * (run_seq + 1) WHERE name = 'supply.current';");
        var folder = Some.TempDirectory();

        var json = await CliRunner.RunAsync("report", "--results", results, "--json");
        var text = await CliRunner.RunAsync("report", "--results", results);
        var files = await CliRunner.RunAsync("report", "--results", results, "--csv", Path.Combine(folder, "r.csv"), "--html", Path.Combine(folder, "r.html"));

        Assert.True(json.Exit == 0 && text.Exit == 0 && files.Exit == 0, json.Err + text.Err + files.Err);
        using var document = JsonDocument.Parse(json.Out);
        var supply = document.RootElement.GetProperty("readings").EnumerateArray().Single(r => r.GetProperty("name").GetString() == "supply.current");
        Assert.Equal(3.5e160, supply.GetProperty("mean").GetDouble(), 1e147);
        Assert.True(double.IsFinite(supply.GetProperty("stdevOverall").GetDouble()));
    }

    [Theory]
    [InlineData("UPDATE runs SET ended_utc = 'yesterday' WHERE seq = 2;", "ended_utc 'yesterday'")]
    [InlineData("UPDATE runs SET verdict = 'maybe' WHERE seq = 2;", "'maybe'")]
    [InlineData("UPDATE readings SET name = '' WHERE run_seq = 2 AND ordinal = 1;", "empty name")]
    [InlineData("UPDATE readings SET value = 'abc' WHERE run_seq = 2 AND ordinal = 1;", "'abc', which is not a number")]
    [InlineData("UPDATE readings SET value = 9e999 WHERE run_seq = 2 AND ordinal = 1;", "not a finite number")]
    [InlineData("UPDATE readings SET low = 5, high = 1 WHERE run_seq = 2 AND ordinal = 1;", "not below its high limit")]
    [InlineData("UPDATE runs SET sequence_id = ' ' WHERE seq = 2;", "the run has no sequence id")]
    public async Task Report_DamagedRow_ExitsTwoNamingTheRunAndWhy(string damage, string expected)
    {
        // Regression: a non-date ended_utc, verdict 'maybe' or an empty reading name crashed the report.
        var results = await DemoAsync(4);
        Execute(results, damage);

        foreach (var args in new[] { new[] { "report", "--json" }, ["report"], ["report", "--html", Path.Combine(Some.TempDirectory(), "r.html")] })
        {
            var (exit, output, error) = await CliRunner.RunAsync([.. args, "--results", results]);

            Assert.Equal(ExitCodes.BadInput, exit);
            Assert.Contains("seq 2", error, StringComparison.Ordinal);
            Assert.Contains(expected, error, StringComparison.Ordinal);
            Assert.DoesNotContain("   at ", output + error, StringComparison.Ordinal);
        }
    }

    [Theory]
    [InlineData("UPDATE runs SET ended_utc = 'yesterday' WHERE seq = 2;", "ended_utc 'yesterday'")]
    [InlineData("UPDATE runs SET verdict = 'maybe' WHERE seq = 2;", "'maybe'")]
    [InlineData("UPDATE runs SET serial = '' WHERE seq = 2;", "the run has no serial")]
    [InlineData("UPDATE runs SET sequence_id = '' WHERE seq = 2;", "the run has no sequence id")]
    [InlineData("UPDATE readings SET name = '' WHERE run_seq = 2 AND ordinal = 1;", "empty name")]
    [InlineData("UPDATE readings SET value = 'abc' WHERE run_seq = 2 AND ordinal = 1;", "'abc', which is not a number")]
    [InlineData("UPDATE readings SET value = 9e999 WHERE run_seq = 2 AND ordinal = 1;", "not a finite number")]
    [InlineData("UPDATE readings SET low = 5, high = 1 WHERE run_seq = 2 AND ordinal = 1;", "not below its high limit")]
    public async Task Report_DamagedRowWithSkipBadRows_ReportsTheOtherRunsAndNamesTheSkippedOne(string damage, string expected)
    {
        // Database rows could not be skipped (only CSV rows could): with --skip-bad-rows the damaged run is left out with
        // all its readings, counted and named with its seq and reason in every format; the other three runs are reported.
        var results = await DemoAsync(4);
        Execute(results, damage);
        var folder = Some.TempDirectory();
        var (csvFile, htmlFile) = (Path.Combine(folder, "r.csv"), Path.Combine(folder, "r.html"));

        var json = await CliRunner.RunAsync("report", "--results", results, "--skip-bad-rows", "--json");
        var text = await CliRunner.RunAsync("report", "--results", results, "--skip-bad-rows", "--csv", csvFile, "--html", htmlFile);

        Assert.True(json.Exit == ExitCodes.Done, json.Err);
        Assert.True(text.Exit == ExitCodes.Done, text.Err);
        using var document = JsonDocument.Parse(json.Out);
        var skipped = Assert.Single(document.RootElement.GetProperty("skippedRows").EnumerateArray()).GetString()!;
        Assert.StartsWith("seq 2: ", skipped, StringComparison.Ordinal);
        Assert.Contains(expected, skipped, StringComparison.Ordinal);
        Assert.Equal(3, document.RootElement.GetProperty("yield").GetProperty("runs").GetInt32());
        Assert.Contains("linetest: damaged run seq 2: ", json.Err, StringComparison.Ordinal);
        Assert.Contains("Skipped 1 bad input row(s)", text.Out, StringComparison.Ordinal);
        Assert.Contains("seq 2: ", text.Out, StringComparison.Ordinal);
        Assert.Contains("seq 2: ", File.ReadAllText(htmlFile), StringComparison.Ordinal);
        var csvLines = File.ReadAllLines(csvFile);
        var column = Array.IndexOf(csvLines[0].Split(','), "skippedRows");
        Assert.True(column >= 0);
        Assert.All(csvLines.Skip(1), line => Assert.EndsWith(",1", line, StringComparison.Ordinal));
        Assert.DoesNotContain("   at ", json.Out + json.Err + text.Out + text.Err, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Report_FileThatIsNotADatabase_ExitsTwo()
    {
        var results = Some.TempDirectory();
        File.WriteAllText(Path.Combine(results, "results.db"), "this is not a database, just text that is long enough to fill a header page");

        var (exit, output, error) = await CliRunner.RunAsync("report", "--results", results);

        Assert.Equal(ExitCodes.BadInput, exit);
        Assert.DoesNotContain("   at ", output + error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Report_TextInNumericCsvColumn_IsAnErrorNeverZero()
    {
        // Regression: text in a numeric column was read as 0 and moved the mean.
        var path = Path.Combine(Some.TempDirectory(), "readings.csv");
        File.WriteAllText(path, "serial,name,value,unit,low,high\nA1,offset,2.5,V,0,5\nA2,offset,two,V,0,5\nA3,offset,2.48,V,0,5\n");

        var refused = await CliRunner.RunAsync("report", "--readings", path);
        var skipped = await CliRunner.RunAsync("report", "--readings", path, "--skip-bad-rows", "--json");

        Assert.Equal(ExitCodes.BadInput, refused.Exit);
        Assert.Contains("line 3: value 'two' is not a number", refused.Err, StringComparison.Ordinal);
        using var json = JsonDocument.Parse(skipped.Out);
        Assert.Equal(2.49, json.RootElement.GetProperty("readings")[0].GetProperty("mean").GetDouble(), 12);
        Assert.Equal("line 3: value 'two' is not a number (use a point as the decimal separator)", json.RootElement.GetProperty("skippedRows")[0].GetString());
    }

    [Fact]
    public async Task Report_ByOperatorAndShiftAndFirstRuns_GroupTotalsMatchTheOverallTable()
    {
        var results = await DemoAsync(8);
        foreach (var by in new[] { "operator", "shift", "slot", "day" })
        {
            var (exit, output, error) = await CliRunner.RunAsync("report", "--results", results, "--json", "--first-runs", "--by", by);

            Assert.True(exit == 0, error);
            using var json = JsonDocument.Parse(output);
            var units = json.RootElement.GetProperty("groups").GetProperty("items").EnumerateArray().Sum(g => g.GetProperty("yield").GetProperty("units").GetInt32());
            Assert.Equal(json.RootElement.GetProperty("yield").GetProperty("units").GetInt32(), units);
        }
    }

    [Fact]
    public async Task Report_NotATerminal_PrintsPlainTextThatNeverSplitsANumber()
    {
        var results = await DemoAsync(8);

        var (exit, output, _) = await CliRunner.RunAsync("report", "--results", results);
        var (_, json, _) = await CliRunner.RunAsync("report", "--results", results, "--json");

        Assert.Equal(0, exit);
        Assert.DoesNotContain("\u001b[", output, StringComparison.Ordinal);
        using var document = JsonDocument.Parse(json);
        foreach (var reading in document.RootElement.GetProperty("readings").EnumerateArray())
        {
            // Every reading name appears whole on some line of the text report.
            Assert.Contains(reading.GetProperty("name").GetString()!, output, StringComparison.Ordinal);
        }

        Assert.Contains("WE1 1 point beyond 3σ", output, StringComparison.Ordinal);
    }
}
