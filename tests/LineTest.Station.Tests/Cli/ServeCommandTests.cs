namespace LineTest.Station.Tests.Cli;

public sealed class ServeCommandTests
{
    [Fact]
    public async Task Serve_NonLoopbackListenWithoutCredential_RefusesToStartExit2SayingWhy()
    {
        var results = Directory.CreateTempSubdirectory("linetest-serve-").FullName;

        var (exit, _, error) = await CliRunner.RunAsync("serve", "--results", results, "--listen", "0.0.0.0:0");

        Assert.Equal(2, exit);
        Assert.Contains("serve cannot start", error, StringComparison.Ordinal);
        Assert.Contains("listening on 0.0.0.0:0 lets other computers connect, so a credential is needed", error, StringComparison.Ordinal);
        Assert.Contains("Station:Web:TokenSha256", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Serve_ListenNotAnAddress_Exit2()
    {
        var (exit, _, error) = await CliRunner.RunAsync("serve", "--listen", "hall-2");

        Assert.Equal(2, exit);
        Assert.Contains("--listen 'hall-2' is not ADDR:PORT", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Serve_ResultsFolderMissing_Exit2NamingIt()
    {
        var missing = Path.Combine(Path.GetTempPath(), "linetest-no-such-folder-" + Guid.NewGuid().ToString("N"));

        var (exit, _, error) = await CliRunner.RunAsync("serve", "--results", missing);

        Assert.Equal(2, exit);
        Assert.Contains($"the results folder '{missing}' does not exist", error, StringComparison.Ordinal);
    }
}
