using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class CheckCommandTests
{
    [Fact]
    public async Task Check_DemoSequenceAgainstDemoFixture_ExitsZero()
    {
        var (exit, output, error) = await CliRunner.RunAsync("check", RepoFiles.Path("sequences/ctp40a-dac.json"), "--fixture", RepoFiles.Path("fixtures/sim-dryblock-4.json"));

        Assert.True(exit == 0, error);
        Assert.Contains("no problems", output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_TwoProblems_ExitsTwoListingBothWithLineAndPath()
    {
        var text = File.ReadAllText(RepoFiles.Path("sequences/ctp40a-dac.json"))
            .Replace("\"cal-high\", \"celsius\": 40", "\"cal-high\", \"celsius\": 140", StringComparison.Ordinal)
            .Replace("\"unit\": \"mA\"", "\"unit\": \"mAmp\"", StringComparison.Ordinal);
        var path = Path.Combine(Some.TempDirectory(), "two-problems.json");
        File.WriteAllText(path, text);

        var (exit, _, error) = await CliRunner.RunAsync("check", path, "--fixture", RepoFiles.Path("fixtures/sim-dryblock-4.json"));

        Assert.Equal(2, exit);
        Assert.Contains($"{path}:25: $.setpoints[1].celsius: 140 °C is outside the safe range", error, StringComparison.Ordinal);
        Assert.Contains($"{path}:48: $.steps[1].limits.unit: unknown unit of measure 'mAmp'", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_MissingFile_ExitsTwo()
    {
        var (exit, _, error) = await CliRunner.RunAsync("check", "no/such/sequence.json");

        Assert.Equal(2, exit);
        Assert.Contains("file not found", error, StringComparison.Ordinal);
    }
}
