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

    [Fact]
    public async Task Serve_ResultsAndFactoryTogether_Exit2()
    {
        var results = Directory.CreateTempSubdirectory("linetest-serve-").FullName;

        var (exit, _, error) = await CliRunner.RunAsync("serve", "--results", results, "--factory", "Host=127.0.0.1;Port=1;Database=linetest");

        Assert.Equal(2, exit);
        Assert.Contains("give either --results or --factory, not both", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Serve_FactoryUnreachable_Exit1SayingWhyWithoutThePassword()
    {
        // Port 1 on loopback: nothing listens, so the connection is refused at once and the page does not start.
        var (exit, _, error) = await CliRunner.RunAsync(
            "serve", "--factory", "Host=127.0.0.1;Port=1;Username=station07;Password=s3cret-pw;Database=linetest;Timeout=3");

        Assert.Equal(1, exit);
        Assert.Contains("serve cannot read the factory database: postgresql://127.0.0.1:1/linetest cannot be read", error, StringComparison.Ordinal);
        Assert.DoesNotContain("s3cret-pw", error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Serve_FactoryNotAConnectionString_Exit2()
    {
        var (exit, _, error) = await CliRunner.RunAsync("serve", "--factory", "Host=127.0.0.1;Port=notaport");

        Assert.Equal(2, exit);
        Assert.Contains("--factory is not a usable connection string", error, StringComparison.Ordinal);
    }
}
