using Serilog.Core;
using Serilog.Events;

namespace LineTest.Station.Composition;

/// <summary>
/// Hands each event to the file sinks, and to the console sinks or the screen as <see cref="LogRouting"/> says,
/// restamped with the routing's clock when it has one. Diagnostics never stop the station: a failing screen callback
/// is ignored.
/// </summary>
public sealed class RoutingSink : ILogEventSink, IDisposable
{
    private readonly LogRouting _routing;
    private readonly Logger _files;
    private readonly Logger _console;

    /// <summary>Routes to <paramref name="files"/> always and <paramref name="console"/> while the console is open.</summary>
    public RoutingSink(LogRouting routing, Logger files, Logger console)
    {
        _routing = routing;
        _files = files;
        _console = console;
    }

    /// <inheritdoc />
    public void Emit(LogEvent logEvent)
    {
        ArgumentNullException.ThrowIfNull(logEvent);
        var stamped = _routing.Clock is { } clock
            ? new LogEvent(clock.GetUtcNow(), logEvent.Level, logEvent.Exception, logEvent.MessageTemplate,
                logEvent.Properties.Select(p => new LogEventProperty(p.Key, p.Value)))
            : logEvent;
        _files.Write(stamped);
        if (_routing.ConsoleOpen)
        {
            _console.Write(stamped);
        }
        else if (logEvent.Level >= LogEventLevel.Warning && _routing.ScreenMessage is { } screen)
        {
            try
            {
                screen(logEvent.RenderMessage(System.Globalization.CultureInfo.InvariantCulture));
            }
            catch (InvalidOperationException)
            {
                // The screen is gone; the file has the event.
            }
        }
    }

    /// <inheritdoc />
    public void Dispose()
    {
        _files.Dispose();
        _console.Dispose();
    }
}
