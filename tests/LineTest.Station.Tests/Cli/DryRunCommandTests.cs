using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

/// <summary>
/// <c>dry-run</c> on definition values that passed <c>check</c> before and then crashed or never ended: each is now
/// refused by the loader with exit 2 and its location, before anything runs.
/// </summary>
public sealed class DryRunCommandTests
{
    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public async Task DryRun_SettlingTimeConstantOf1e308_ExitsTwoNamingTheKey(bool json)
    {
        // Regression: --json crashed (Infinity cannot be written as JSON); the text form printed 2147483647:00.
        var fixture = EditedFile(RepoFiles.Path("fixtures/sim-dryblock-4.json"), "\"settlingTimeConstantSeconds\": 40", "\"settlingTimeConstantSeconds\": 1e308");
        string[] args = ["dry-run", RepoFiles.Path("sequences/ctp40a-dac.json"), "--fixture", fixture, .. json ? new[] { "--json" } : []];

        var (exit, output, error) = await CliRunner.RunAsync(args);

        Assert.Equal(2, exit);
        Assert.Contains($"{fixture}:13: $.source.settlingTimeConstantSeconds: must be a number above 0 and at most 3600 s, not 1E+308", error, StringComparison.Ordinal);
        Assert.DoesNotContain("Infinity", output, StringComparison.Ordinal);
        Assert.DoesNotContain("2147483647", output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task DryRun_HundredMillionSamples_ExitsTwoInsteadOfRunningForever()
    {
        var sequence = EditedFile(RepoFiles.Path("sequences/ctp40a-dac.json"), "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 10",
            "\"name\": \"cal-low\", \"setpoint\": \"cal-low\", \"samples\": 100000000");

        var (exit, _, error) = await CliRunner.RunAsync("dry-run", sequence, "--fixture", RepoFiles.Path("fixtures/sim-dryblock-4.json"));

        Assert.Equal(2, exit);
        Assert.Contains("$.steps[4].samples: must be a whole number 1 … 1000, not 100000000", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Demo_NegativeBlockNoise_ExitsTwoInsteadOfCrashing()
    {
        // Regression: simulation.blockNoiseC -1 passed check and crashed demo (exit 134).
        var fixture = EditedFile(RepoFiles.Path("fixtures/sim-dryblock-4.json"), "\"blockNoiseC\": 0.002", "\"blockNoiseC\": -1");

        var (exit, _, error) = await CliRunner.RunAsync("demo", "--fixture", fixture, "--units", "4", "--results", Some.TempDirectory());

        Assert.Equal(2, exit);
        Assert.Contains("$.simulation.blockNoiseC: must be a number 0 … 1 °C, not -1", error, StringComparison.Ordinal);
    }

    private static string EditedFile(string original, string find, string replace)
    {
        var text = File.ReadAllText(original);
        Assert.Contains(find, text, StringComparison.Ordinal);
        var path = Path.Combine(Some.TempDirectory(), Path.GetFileName(original));
        File.WriteAllText(path, text.Replace(find, replace, StringComparison.Ordinal));
        return path;
    }
}
