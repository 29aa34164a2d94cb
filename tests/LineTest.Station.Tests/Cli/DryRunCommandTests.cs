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

    [Fact]
    public async Task DryRun_Json_ReportsUnitsPerHourTheBoundsAndTheModePerSequenceAndSetpoint()
    {
        // The keys the issue names (unitsPerHour, boundUnitsPerHour, the mode) for a sequence in window mode and the same
        // sequence settling predictively: the predictive bound is above the wait-for-stability bound, which stays the
        // window sequence's own bound.
        var windowFile = RepoFiles.Path("sequences/ctp40r-resistor.json");
        var text = File.ReadAllText(windowFile);
        var predictiveFile = Path.Combine(Some.TempDirectory(), "ctp40r-predictive.json");
        File.WriteAllText(predictiveFile, text.Replace("\"soak\": {", "\"settle\": { \"mode\": \"predictive\", \"maxExtrapolationUncertaintyC\": 0.01 },\n  \"soak\": {", StringComparison.Ordinal)
            .Replace("\"$schema\": \"./sequence.schema.json\",", string.Empty, StringComparison.Ordinal));
        var fixture = RepoFiles.Path("fixtures/sim-dryblock-4.json");

        var (windowExit, windowOut, windowErr) = await CliRunner.RunAsync("dry-run", windowFile, "--fixture", fixture, "--json");
        var (predictiveExit, predictiveOut, predictiveErr) = await CliRunner.RunAsync("dry-run", predictiveFile, "--fixture", fixture, "--json");

        Assert.True(windowExit == 0, windowErr);
        Assert.True(predictiveExit == 0, predictiveErr);
        using var w = System.Text.Json.JsonDocument.Parse(windowOut);
        using var p = System.Text.Json.JsonDocument.Parse(predictiveOut);
        Assert.Equal("window", w.RootElement.GetProperty("mode").GetString());
        Assert.Equal("predictive", p.RootElement.GetProperty("mode").GetString());
        Assert.Equal(w.RootElement.GetProperty("boundUnitsPerHour").GetDouble(), w.RootElement.GetProperty("windowBoundUnitsPerHour").GetDouble());
        Assert.Equal(w.RootElement.GetProperty("boundUnitsPerHour").GetDouble(), p.RootElement.GetProperty("windowBoundUnitsPerHour").GetDouble());
        Assert.True(p.RootElement.GetProperty("boundUnitsPerHour").GetDouble() > p.RootElement.GetProperty("windowBoundUnitsPerHour").GetDouble());
        Assert.True(p.RootElement.GetProperty("unitsPerHour").GetDouble() > w.RootElement.GetProperty("unitsPerHour").GetDouble());
        Assert.All(w.RootElement.GetProperty("setpoints").EnumerateArray(), s => Assert.Equal("window", s.GetProperty("mode").GetString()));
        Assert.All(p.RootElement.GetProperty("setpoints").EnumerateArray(), s =>
            Assert.Contains(s.GetProperty("mode").GetString(), new[] { "predictive", "window-fallback" }));
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
