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

    private static async Task<string> DemoResultsAsync()
    {
        var results = Some.TempDirectory();
        var (exit, _, error) = await CliRunner.RunAsync("demo", "--units", "4", "--results", results, "--json");
        Assert.True(exit == 0, error);
        return results;
    }
}
