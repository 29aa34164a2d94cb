using LineTest.Station.Tests.Cli;
using LineTest.Station.Tests.Hosting;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Composition;

public sealed class WriterLockTests
{
    [Fact]
    public async Task SecondDemoProcess_OnAFolderInUse_ExitsOneNamingTheHolder_AndTheFirstIsUnharmed()
    {
        // Regression: 'demo --units 2000 --results R & demo --units 1 --results R' poisoned R for good: the second start
        // stored the first one's live runs as interrupted, the first then failed on UNIQUE constraint, and so did every
        // later start.
        var results = Some.TempDirectory();
        using var first = LinetestProcess.Start(null, "demo", "--units", "120", "--results", results);
        await first.WaitForAsync(" slot ", times: 4);

        using (var second = LinetestProcess.Start(null, "demo", "--units", "1", "--results", results))
        {
            Assert.Equal(1, await second.WaitForExitAsync());
            Assert.Contains($"linetest: results folder {results} is in use by process {first.Id} on {Environment.MachineName} since ", second.Error, StringComparison.Ordinal);
        }

        Assert.Equal(0, await first.WaitForExitAsync());
        var (verifyExit, verifyOut, _) = await CliRunner.RunAsync("verify", "--results", results);
        Assert.True(verifyExit == 0, verifyOut);
        Assert.Contains("intact, 120 runs", verifyOut, StringComparison.Ordinal);
    }

    [Fact]
    public async Task EveryWriter_WhileAStationRunsOnTheFolder_IsRefused_AndReadersAreNot()
    {
        var results = Some.TempDirectory();
        using var station = new StationProcess(Some.TempDirectory(), new Dictionary<string, string> { ["Station:Results"] = results });
        await station.WaitForAsync("Scan the serial for slot 1");

        string[][] writers =
        [
            ["demo", "--units", "1", "--results", results],
            ["campaign", "--units", "4", "--results", results],
            ["release", RepoFiles.Path("sequences/ctp40a-dac.json"), "--by", "engineer", "--results", results],
            ["run"],
        ];
        foreach (var args in writers)
        {
            using var second = LinetestProcess.Start(new Dictionary<string, string> { ["LINETEST_Station__Results"] = results }, args);
            var exit = await second.WaitForExitAsync();

            Assert.True(exit == 1, $"{args[0]}: exit {exit}\n{second.Error}");
            Assert.Contains($"results folder {results} is in use by process {station.Id} on {Environment.MachineName} since ", second.Error, StringComparison.Ordinal);
        }

        Assert.Equal(0, (await CliRunner.RunAsync("verify", "--results", results)).Exit);
        Assert.Equal(0, (await CliRunner.RunAsync("backup", "--results", results, "--to", Path.Combine(Some.TempDirectory(), "b.db"))).Exit);
        station.CloseInput();
        Assert.Equal(0, await station.WaitForExitAsync());
    }

    [Fact]
    public async Task Demo_AfterTheHolderWasKilled_TakesTheFolderWithoutCleanUpAndRecovers()
    {
        var results = Some.TempDirectory();
        using (var first = LinetestProcess.Start(null, "demo", "--units", "200", "--results", results))
        {
            await first.WaitForAsync(" slot ", times: 6);
            first.Kill();
            await first.WaitForExitAsync();
        }

        var (exit, output, error) = await CliRunner.RunAsync("demo", "--units", "4", "--results", results);

        // Whether a batch was in progress at the kill depends on timing; either way the folder is usable at once.
        Assert.True(exit == 0, error);
        Assert.Contains("Units 4:", output, StringComparison.Ordinal);
        var (verifyExit, verifyOut, _) = await CliRunner.RunAsync("verify", "--results", results);
        Assert.True(verifyExit == 0, verifyOut);
    }
}
