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
        var celsiusLine = LineOf(text, "\"celsius\": 140");
        var unitLine = LineOf(text, "\"unit\": \"mAmp\"");
        Assert.Contains($"{path}:{celsiusLine}: $.setpoints[1].celsius: 140 °C is outside the safe range", error, StringComparison.Ordinal);
        Assert.Contains($"{path}:{unitLine}: $.steps[1].limits.unit: unknown unit of measure 'mAmp'", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_MissingFile_ExitsTwo()
    {
        var (exit, _, error) = await CliRunner.RunAsync("check", "no/such/sequence.json");

        Assert.Equal(2, exit);
        Assert.Contains("file not found", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_DuplicateStepName_NamesTheFirstByItsJsonPath()
    {
        // Regression: "$.steps[6].name … already used by step 4" mixed 0-based paths with a 1-based step number.
        var path = Edited("\"kind\": \"measure\", \"name\": \"cal-high\"", "\"kind\": \"measure\", \"name\": \"cal-low\"");

        var (exit, _, error) = await CliRunner.RunAsync("check", path);

        Assert.Equal(2, exit);
        Assert.Contains("$.steps[6].name: step name 'cal-low' is already used at $.steps[4].name", error, StringComparison.Ordinal);
        Assert.DoesNotContain("by step", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_TrailingCommaAndKeyGivenTwice_ExitsTwoWithTheirLines()
    {
        // Regression: both passed check; the second of two keys silently won.
        var path = Edited("\"revision\": 3,", "\"revision\": 3,\n  \"revision\": 4,");
        File.WriteAllText(path, File.ReadAllText(path).Replace("\"verify\", \"celsius\": 5 }", "\"verify\", \"celsius\": 5 },", StringComparison.Ordinal));

        var (exit, _, error) = await CliRunner.RunAsync("check", path);

        Assert.Equal(2, exit);
        Assert.Contains($"{path}:5: $.revision: 'revision' is given twice: first at line 4, again at line 5", error, StringComparison.Ordinal);
        Assert.Contains("$.setpoints: a comma before the closing ']' is not allowed", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Check_BadFixtureNumber_ExitsTwoBeforeTheSequenceIsRead()
    {
        var fixture = Path.Combine(Some.TempDirectory(), "fixture.json");
        File.WriteAllText(fixture, File.ReadAllText(RepoFiles.Path("fixtures/sim-dryblock-4.json")).Replace("\"blockNoiseC\": 0.002", "\"blockNoiseC\": -1", StringComparison.Ordinal));

        var (exit, _, error) = await CliRunner.RunAsync("check", RepoFiles.Path("sequences/ctp40a-dac.json"), "--fixture", fixture);

        Assert.Equal(2, exit);
        Assert.Contains("$.simulation.blockNoiseC", error, StringComparison.Ordinal);
    }

    private static string Edited(string find, string replace)
    {
        var text = File.ReadAllText(RepoFiles.Path("sequences/ctp40a-dac.json"));
        Assert.Contains(find, text, StringComparison.Ordinal);
        var path = Path.Combine(Some.TempDirectory(), "edited.json");
        File.WriteAllText(path, text.Replace(find, replace, StringComparison.Ordinal));
        return path;
    }

    /// <summary>The 1-based line of the first occurrence of <paramref name="find"/>, so the test follows edits of the file.</summary>
    private static int LineOf(string text, string find) =>
        text[..text.IndexOf(find, StringComparison.Ordinal)].Count(c => c == '\n') + 1;
}
