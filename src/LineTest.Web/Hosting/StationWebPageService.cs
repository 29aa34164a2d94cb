using LineTest.Web.Data;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>
/// The live page inside the hosted station: started and stopped with the station, read-only on its own results. A page
/// that cannot listen (its port held by another program) does not stop the station: it runs without the page and the
/// log says why.
/// </summary>
internal sealed partial class StationWebPageService : IHostedService, IAsyncDisposable
{
    private readonly WebPageSetup _setup;
    private WebApplication? _app;

    public StationWebPageService(WebPageSetup setup) => _setup = setup;

    public async Task StartAsync(CancellationToken cancellationToken)
    {
        if (WebPageApp.CannotListen(_setup.Listen) is { } reason)
        {
            WarnCannotListen(reason);
            return;
        }

        // The port may still be taken between the look and the start: the same warning then.
        var app = WebPageApp.Create(_setup);
        try
        {
            await app.StartAsync(cancellationToken).ConfigureAwait(false);
            _app = app;
        }
        catch (IOException ex)
        {
            await app.DisposeAsync().ConfigureAwait(false);
            WarnCannotListen(ex.Message);
        }
    }

    private void WarnCannotListen(string reason)
    {
        if (_setup.Loggers is { } loggers)
        {
            LogCannotListen(loggers.CreateLogger<StationWebPageService>(), _setup.Listen.ToString(), reason);
        }
    }

    [LoggerMessage(EventId = 4091, Level = LogLevel.Warning,
        Message = "The live page cannot listen on {Listen} ({Reason}); the station tests without the live page. Free the port or set another Station:Web:Listen, then restart the station to have the page")]
    private static partial void LogCannotListen(ILogger logger, string listen, string reason);

    public async Task StopAsync(CancellationToken cancellationToken)
    {
        if (_app is not null)
        {
            await _app.StopAsync(cancellationToken).ConfigureAwait(false);
        }
    }

    public async ValueTask DisposeAsync()
    {
        if (_app is not null)
        {
            await _app.DisposeAsync().ConfigureAwait(false);
            _app = null;
        }
    }

    /// <summary>The setup for the station's own results folder, with its forwarding backlog when it forwards.</summary>
    public static WebPageSetup Setup(
        Access.ListenAddress listen, WebPageOptions options, string resultsDirectory, TimeProvider time, ILoggerFactory loggers, Factory.Forwarding.IFactoryBacklog? backlog = null) =>
        new(listen, options, new SqliteFolderSource([resultsDirectory], backlog)) { Time = time, Loggers = loggers };
}
