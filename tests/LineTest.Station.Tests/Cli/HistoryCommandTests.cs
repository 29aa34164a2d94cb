using System.Text.Json;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class HistoryCommandTests
{
    [Fact]
    public async Task History_SerialOfADemoRun_ListsItsRunWithStationSlotVerdictAndDisposition()
    {
        var results = Some.TempDirectory();
        var (_, demo, _) = await CliRunner.RunAsync("demo", "--units", "2", "--results", results);
        var first = demo.Split('\n')[0].Split(' ', StringSplitOptions.RemoveEmptyEntries);
        var serial = first[0];

        var (exit, output, error) = await CliRunner.RunAsync("history", serial, "--results", results);

        Assert.True(exit == 0, error);
        Assert.Contains($"History of {serial}: 1 run", output, StringComparison.Ordinal);
        Assert.Matches($@"ST-01 slot {first[2]}\s+{first[3]}", output);
        Assert.Contains("→ ", output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task History_Json_OneObjectWithEveryRun()
    {
        var results = Some.TempDirectory();
        var (_, demo, _) = await CliRunner.RunAsync("demo", "--units", "2", "--results", results);
        var serial = demo.Split(' ', 2)[0];

        var (exit, output, _) = await CliRunner.RunAsync("history", serial, "--results", results, "--json");

        Assert.Equal(0, exit);
        using var json = JsonDocument.Parse(output);
        Assert.Equal(serial, json.RootElement.GetProperty("serial").GetString());
        var run = Assert.Single(json.RootElement.GetProperty("runs").EnumerateArray());
        Assert.Contains(run.GetProperty("verdict").GetString(), new[] { "pass", "fail", "error" });
        Assert.Equal("ST-01", run.GetProperty("station").GetString());
        Assert.False(string.IsNullOrEmpty(run.GetProperty("disposition").GetString()));
    }

    [Fact]
    public async Task History_NoDatabase_ExitsTwo()
    {
        var (exit, _, error) = await CliRunner.RunAsync("history", "CTP40A-2612-000001", "--results", Some.TempDirectory());

        Assert.Equal(2, exit);
        Assert.Contains("no results database", error, StringComparison.Ordinal);
    }
}
