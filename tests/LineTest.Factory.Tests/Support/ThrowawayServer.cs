using System.Diagnostics;
using System.Net;
using System.Net.Sockets;

namespace LineTest.Factory.Tests.Support;

/// <summary>
/// A PostgreSQL server of the test's own, on a temporary data folder and a free loopback port, that the test may
/// stop and start again (an outage). Started as the <c>postgres</c> user when the tests run as root (the server
/// refuses to run as root). The binaries are found like .ci/run finds them: <c>/usr/lib/postgresql/*/bin</c>.
/// </summary>
public sealed class ThrowawayServer : IAsyncDisposable
{
    private readonly string _bin;
    private readonly string _folder;

    private ThrowawayServer(string bin, string folder, int port)
    {
        _bin = bin;
        _folder = folder;
        Port = port;
    }

    public int Port { get; }

    public string ConnectionString => $"Host=127.0.0.1;Port={Port};Username=postgres;Database=postgres;Timeout=3;Pooling=false";

    /// <summary>The bin folder of the newest installed server, or null.</summary>
    public static string? FindBin()
    {
        const string root = "/usr/lib/postgresql";
        if (!Directory.Exists(root))
        {
            return null;
        }

        return Directory.GetDirectories(root)
            .Select(d => Path.Combine(d, "bin"))
            .Where(d => File.Exists(Path.Combine(d, "pg_ctl")))
            .OrderByDescending(d => int.TryParse(Path.GetFileName(Path.GetDirectoryName(d)), out var v) ? v : 0)
            .FirstOrDefault();
    }

    public static async Task<ThrowawayServer> StartAsync()
    {
        var bin = FindBin() ?? throw new InvalidOperationException("No PostgreSQL server is installed (/usr/lib/postgresql/*/bin); .ci/run installs Debian's postgresql.");
        var folder = Path.Combine(Path.GetTempPath(), "linetest-pg-" + Guid.NewGuid().ToString("N")[..8]);
        Directory.CreateDirectory(folder);
        if (Environment.UserName == "root")
        {
            await RunAsync("chown", ["postgres", folder]);
        }

        var server = new ThrowawayServer(bin, folder, FreePort());
        await server.PgAsync("initdb", ["-D", server.Data, "-A", "trust", "-U", "postgres"]);
        await server.StartAgainAsync();
        return server;
    }

    public Task StartAgainAsync() =>
        PgAsync("pg_ctl", ["-D", Data, "-o", $"-p {Port} -k {_folder} -c listen_addresses=127.0.0.1", "-l", Path.Combine(_folder, "log"), "-w", "start"]);

    public Task StopAsync() => PgAsync("pg_ctl", ["-D", Data, "-m", "fast", "-w", "stop"]);

    public async ValueTask DisposeAsync()
    {
        try
        {
            await PgAsync("pg_ctl", ["-D", Data, "-m", "immediate", "-w", "stop"]);
        }
        catch (InvalidOperationException)
        {
            // Already stopped.
        }

        try
        {
            Directory.Delete(_folder, recursive: true);
        }
        catch (IOException)
        {
        }
    }

    private string Data => Path.Combine(_folder, "data");

    private Task PgAsync(string tool, string[] arguments) =>
        Environment.UserName == "root"
            ? RunAsync("runuser", ["-u", "postgres", "--", Path.Combine(_bin, tool), .. arguments])
            : RunAsync(Path.Combine(_bin, tool), arguments);

    private static async Task RunAsync(string file, string[] arguments)
    {
        var start = new ProcessStartInfo(file) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var argument in arguments)
        {
            start.ArgumentList.Add(argument);
        }

        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        await process.WaitForExitAsync();
        if (process.ExitCode != 0)
        {
            throw new InvalidOperationException($"{file} {string.Join(' ', arguments)} exited {process.ExitCode}: {await error}{await output}");
        }
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
