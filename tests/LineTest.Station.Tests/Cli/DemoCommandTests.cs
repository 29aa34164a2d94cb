using System.Text.Json;
using LineTest.TestSupport;
using Microsoft.Data.Sqlite;

namespace LineTest.Station.Tests.Cli;

public sealed class DemoCommandTests
{
    [Fact]
    public async Task Demo_Json_PrintsTheSummaryObjectWithItsContractKeys()
    {
        var results = Some.TempDirectory();

        var (exit, output, error) = await CliRunner.RunAsync("demo", "--units", "6", "--results", results, "--json");

        Assert.True(exit == 0, error);
        using var json = JsonDocument.Parse(output);
        var keys = json.RootElement.EnumerateObject().Select(p => p.Name).ToArray();
        Assert.Equal(["units", "pass", "fail", "error", "firstPassYield", "simulatedSeconds", "wallSeconds", "resultsPath", "head"], keys);
        Assert.Equal(6, json.RootElement.GetProperty("units").GetInt32());
        var root = json.RootElement;
        Assert.Equal(6, root.GetProperty("pass").GetInt32() + root.GetProperty("fail").GetInt32() + root.GetProperty("error").GetInt32());
        Assert.True(root.GetProperty("simulatedSeconds").GetDouble() > 1800, "two batches, each settling at three setpoints, take more than half an hour of virtual time");
    }

    [Fact]
    public async Task Demo_TwiceIntoOneFolder_AppendsRuns()
    {
        var results = Some.TempDirectory();

        await CliRunner.RunAsync("demo", "--units", "2", "--results", results, "--json");
        await CliRunner.RunAsync("demo", "--units", "3", "--results", results, "--seed", "5", "--json");

        using var connection = new SqliteConnection($"Data Source={Path.Combine(results, "results.db")};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT count(*) FROM runs";
        Assert.Equal(5L, (long)command.ExecuteScalar()!);
    }

    [Theory]
    [InlineData("--units", "0")]
    [InlineData("--slots", "9")]
    [InlineData("--units", "many")]
    [InlineData("--no-such-option", "1")]
    public async Task Demo_BadArguments_ExitTwo(string option, string value)
    {
        var (exit, _, error) = await CliRunner.RunAsync("demo", option, value, "--results", Some.TempDirectory());

        Assert.Equal(2, exit);
        Assert.NotEmpty(error);
    }
}
