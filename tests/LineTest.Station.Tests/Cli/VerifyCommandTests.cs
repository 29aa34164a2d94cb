using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Cli;

public sealed class VerifyCommandTests
{
    [Fact]
    public async Task Verify_FreshDemoResults_Intact()
    {
        var results = await DemoResultsAsync();

        var (exit, output, _) = await CliRunner.RunAsync("verify", "--results", results);

        Assert.Equal(0, exit);
        Assert.Contains("intact, 4 runs", output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("UPDATE readings SET value = value + 0.1 WHERE name = 'verify.error' AND run_seq = 2")]
    [InlineData("UPDATE runs SET verdict = CASE verdict WHEN 'pass' THEN 'fail' ELSE 'pass' END WHERE seq = 3")]
    [InlineData("DELETE FROM readings WHERE run_seq = 2; DELETE FROM runs WHERE seq = 2")]
    public async Task Verify_TamperedDatabase_ExitsOneNamingTheProblem(string tamper)
    {
        var results = await DemoResultsAsync();
        using (var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Pooling=False"))
        {
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = tamper;
            Assert.True(command.ExecuteNonQuery() > 0);
        }

        var (exit, output, _) = await CliRunner.RunAsync("verify", "--results", results);

        Assert.Equal(1, exit);
        Assert.Contains("NOT INTACT", output, StringComparison.Ordinal);
        Assert.Contains("first problem", output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Verify_NoDatabase_ExitsTwo()
    {
        var (exit, _, error) = await CliRunner.RunAsync("verify", "--results", Some.TempDirectory());

        Assert.Equal(2, exit);
        Assert.Contains("no results database", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Verify_ExpectHeadFromTheDemoSummary_IntactUntilTheTailIsLost()
    {
        var results = Some.TempDirectory();
        var (_, demoOut, _) = await CliRunner.RunAsync("demo", "--units", "4", "--results", results, "--json");
        var head = System.Text.Json.JsonDocument.Parse(demoOut).RootElement.GetProperty("head").GetString()!;
        Assert.StartsWith("4:", head, StringComparison.Ordinal);

        Assert.Equal(0, (await CliRunner.RunAsync("verify", "--results", results, "--expect-head", head)).Exit);
        Execute(results, "DELETE FROM readings WHERE run_seq = 4; DELETE FROM runs WHERE seq = 4");
        var (exit, output, _) = await CliRunner.RunAsync("verify", "--results", results, "--expect-head", head);

        Assert.Equal(1, exit);
        Assert.Contains("runs missing after seq 3", output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("4")]
    [InlineData("4:abc")]
    public async Task Verify_ExpectHeadNotSeqColonHash_ExitsTwo(string anchor)
    {
        var (exit, _, error) = await CliRunner.RunAsync("verify", "--results", Some.TempDirectory(), "--expect-head", anchor);

        Assert.Equal(2, exit);
        Assert.Contains("is not SEQ:HASH", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Verify_ManyProblems_ListsTheFirstFiftyAndSaysHowManyMore()
    {
        var results = Some.TempDirectory();
        await using (var store = LineTest.Storage.Sqlite.SqliteResultStore.Open(results))
        {
            for (var i = 0; i < 60; i++)
            {
                await store.AppendAsync(new LineTest.TestSupport.Builders.RunRecordBuilder().Build(), CancellationToken.None);
            }
        }

        Execute(results, "UPDATE runs SET serial = 'CHANGED'");
        var (exit, output, _) = await CliRunner.RunAsync("verify", "--results", results);

        Assert.Equal(1, exit);
        Assert.Contains("NOT INTACT: 60 problems", output, StringComparison.Ordinal);
        Assert.Equal(50, output.Split('\n').Count(l => l.StartsWith("  RunChanged at seq ", StringComparison.Ordinal)));
        Assert.Contains("  ... and 10 more", output, StringComparison.Ordinal);
    }

    private static void Execute(string results, string sql)
    {
        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        Assert.True(command.ExecuteNonQuery() > 0);
    }

    private static async Task<string> DemoResultsAsync()
    {
        var results = Some.TempDirectory();
        var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", "4", "--results", results, "--json");
        Assert.True(exit == 0, error);
        return results;
    }
}
