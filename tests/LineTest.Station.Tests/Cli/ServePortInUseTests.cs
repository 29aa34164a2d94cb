using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Cli;

public sealed class ServePortInUseTests
{
    // Found when starting `serve` on a port another program held: exit 1 with a clear line, but the web host's own
    // "Hosting failed to start" error and its stack trace came first on the terminal.
    [Fact]
    public async Task Serve_PortHeldByAnotherProgram_ExitOneWithOneLineAndNoStackTrace()
    {
        using var holder = new TcpListener(IPAddress.Loopback, 0);
        holder.Start();
        var port = ((IPEndPoint)holder.LocalEndpoint).Port;
        var results = Path.Combine(Some.TempDirectory(), "results");
        Directory.CreateDirectory(results);
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = Some.TempDirectory(),
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "linetest.dll"));
        foreach (var argument in new[] { "serve", "--results", results, "--listen", $"127.0.0.1:{port}" })
        {
            start.ArgumentList.Add(argument);
        }

        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEndAsync();
        var output = process.StandardOutput.ReadToEndAsync();
        using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(60));
        await process.WaitForExitAsync(timeout.Token);
        var text = await error + await output;

        Assert.Equal(1, process.ExitCode);
        Assert.Contains($"linetest: serve cannot listen on 127.0.0.1:{port}", text, StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", text, StringComparison.Ordinal);
        Assert.DoesNotContain("Hosting failed to start", text, StringComparison.Ordinal);
    }
}
