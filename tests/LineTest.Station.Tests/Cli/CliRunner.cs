using LineTest.Station.Cli;
using LineTest.Station.Composition;
using LineTest.TestSupport;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Cli;

/// <summary>Runs the real command line in-process with captured output, from the repository root.</summary>
internal static class CliRunner
{
    public static async Task<(int Exit, string Out, string Err)> RunAsync(params string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        var root = RepoFiles.Root;
        var context = new CliContext(root, new ConfigurationBuilder().Build(), new StationOptions(), output, error, NullLoggerFactory.Instance);
        var exit = await StationCommandLine.InvokeAsync(context, args, CancellationToken.None);
        return (exit, output.ToString(), error.ToString());
    }
}
