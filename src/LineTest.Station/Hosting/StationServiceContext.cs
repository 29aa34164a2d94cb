using LineTest.Runtime.Batches;
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

    /// <summary>
    /// Wraps what watches the batch (the screen model) before the coordinator gets it, e.g. to feed another view or,
    /// in tests, to fail at a chosen moment; null: the screen model alone.
    /// </summary>
    public Func<IBatchObserver, IBatchObserver>? Observe { get; init; }

    /// <summary>Ctrl-C and SIGTERM, when the process listens for them.</summary>
    public StopSignals? Signals { get; init; }
}
