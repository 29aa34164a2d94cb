using LineTest.Station.Composition;

namespace LineTest.Station.Hosting;

/// <summary>What the hosted station is started with.</summary>
/// <param name="Root">Folder of appsettings.json; relative paths resolve here.</param>
/// <param name="Options">The Station section.</param>
/// <param name="Input">The keyboard (standard input).</param>
/// <param name="Output">Standard output.</param>
/// <param name="Error">Standard error.</param>
public sealed record StationServiceContext(string Root, StationOptions Options, TextReader Input, TextWriter Output, TextWriter Error)
{
    /// <summary>Where log events go while the live screen owns the terminal.</summary>
    public LogRouting Logging { get; init; } = new();

    /// <summary>Ctrl-C and SIGTERM, when the process listens for them.</summary>
    public StopSignals? Signals { get; init; }
}
