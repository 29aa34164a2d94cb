using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class BackupCommandTests
{
    [Fact]
    public async Task Backup_DuringARunningShift_RestoresToAFolderThatVerifies()
    {
        var results = Some.TempDirectory();
        var backup = Path.Combine(Some.TempDirectory(), "mid-shift.db");
        using var shift = LinetestProcess.Start(null, "demo", "--units", "120", "--results", results);
        await shift.WaitForAsync(" slot ", times: 8);

        var (exit, output, error) = await CliRunner.RunAsync("backup", "--results", results, "--to", backup);

        Assert.True(exit == 0, error);
        Assert.Contains($"to {backup}", output, StringComparison.Ordinal);
        var restored = Some.TempDirectory();
        File.Copy(backup, Path.Combine(restored, "results.db"));
        File.Copy(backup + ".head", Path.Combine(restored, "results.head"));
        var (verifyExit, verifyOut, _) = await CliRunner.RunAsync("verify", "--results", restored);
        Assert.True(verifyExit == 0, verifyOut);
        Assert.Equal(0, await shift.WaitForExitAsync());
        Assert.Equal(0, (await CliRunner.RunAsync("verify", "--results", results)).Exit);
    }

    [Fact]
    public async Task Backup_NoDatabase_ExitsTwo()
    {
        var (exit, _, error) = await CliRunner.RunAsync("backup", "--results", Some.TempDirectory(), "--to", Path.Combine(Some.TempDirectory(), "x.db"));

        Assert.Equal(2, exit);
        Assert.Contains("no results database", error, StringComparison.Ordinal);
    }
}
