using System.Text.Json;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class CampaignCommandTests
{
    [Fact]
    public async Task Campaign_TwoHundredUnitsWithFaults_NoWrongPassLostRunOpenRunOrSourceLeftAway()
    {
        var (exit, output, error) = await CliRunner.RunAsync("campaign", "--units", "200", "--fault-rate", "0.5", "--seed", "11", "--results", Some.TempDirectory(), "--json");

        Assert.True(exit == 0, output + error);
        using var json = JsonDocument.Parse(output);
        var root = json.RootElement;
        Assert.Equal(200, root.GetProperty("units").GetInt32());
        Assert.True(root.GetProperty("faultedBatches").GetInt32() >= 10, "half of 50 batches should carry a fault");
        Assert.True(root.GetProperty("abortedBatches").GetInt32() > 0, "instrument faults should stop some batches");
        Assert.True(root.GetProperty("error").GetInt32() > 0, "faults should end some runs in error");
        Assert.Equal(0, root.GetProperty("wrongPasses").GetInt32());
        Assert.Equal(0, root.GetProperty("lostRuns").GetInt32());
        Assert.Equal(0, root.GetProperty("duplicateRuns").GetInt32());
        Assert.Equal(0, root.GetProperty("runsWithoutVerdict").GetInt32());
        Assert.Equal(0, root.GetProperty("sourceLeftAwayFromStandby").GetInt32());
        Assert.Equal(200, root.GetProperty("pass").GetInt32() + root.GetProperty("fail").GetInt32() + root.GetProperty("error").GetInt32());
    }

    [Fact]
    public async Task Campaign_Fuzz_NoLoaderCrashNoUnhandledExceptionEveryUnitHasAVerdict()
    {
        var (exit, output, error) = await CliRunner.RunAsync("campaign", "--fuzz", "600", "--seed", "3", "--json");

        Assert.True(exit == 0, output + error);
        using var json = JsonDocument.Parse(output);
        var root = json.RootElement;
        Assert.Equal(600, root.GetProperty("loaderCases").GetInt32());
        Assert.True(root.GetProperty("refused").GetInt32() > 300, "most damaged files must be refused");
        Assert.Equal(0, root.GetProperty("loaderCrashes").GetInt32());
        Assert.Equal(0, root.GetProperty("problemsWithoutLocation").GetInt32());
        Assert.Equal(24, root.GetProperty("units").GetInt32());
        Assert.Equal(0, root.GetProperty("unhandledInBatches").GetInt32());
        Assert.Equal(0, root.GetProperty("unitsWithoutVerdict").GetInt32());
    }

    [Theory]
    [InlineData("--fault-rate", "1.5")]
    [InlineData("--units", "0")]
    [InlineData("--fuzz", "0")]
    public async Task Campaign_BadArguments_ExitTwo(string option, string value)
    {
        var (exit, _, error) = await CliRunner.RunAsync("campaign", option, value, "--results", Some.TempDirectory());

        Assert.Equal(2, exit);
        Assert.NotEmpty(error);
    }
}
