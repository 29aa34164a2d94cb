using LineTest.Station.Composition;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Cli;

/// <summary>What every command needs: where it runs, its settings, its output and its loggers.</summary>
/// <param name="Root">Folder of appsettings.json; relative paths in it resolve here.</param>
/// <param name="Configuration">The loaded configuration.</param>
/// <param name="Options">The Station section.</param>
/// <param name="Output">Standard output.</param>
/// <param name="Error">Standard error.</param>
/// <param name="Loggers">Serilog-backed logger factory.</param>
public sealed record CliContext(
    string Root,
    IConfiguration Configuration,
    StationOptions Options,
    TextWriter Output,
    TextWriter Error,
    ILoggerFactory Loggers)
{
    /// <summary>The clock for what a command records (e.g. when a sequence was released). Default: the system clock.</summary>
    public TimeProvider Clock { get; init; } = TimeProvider.System;

    /// <summary>Where log events go besides the log file (the console while it is open); changed by <c>run</c> and <c>demo</c>.</summary>
    public LogRouting Logging { get; init; } = new();

    /// <summary>Ctrl-C and SIGTERM, when the process listens for them (null in tests that run commands in-process).</summary>
    public Hosting.StopSignals? Signals { get; init; }

    /// <summary>Prints a bad-input message and returns <see cref="ExitCodes.BadInput"/>.</summary>
    public int BadInput(string message)
    {
        Error.WriteLine($"linetest: {message}");
        return ExitCodes.BadInput;
    }
}
