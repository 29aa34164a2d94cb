using LineTest.Web.Data;
using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>The live page inside the hosted station: started and stopped with the station, read-only on its own results.</summary>
internal sealed class StationWebPageService : IHostedService, IAsyncDisposable
{
    private readonly WebPageSetup _setup;
    private WebApplication? _app;

    public StationWebPageService(WebPageSetup setup) => _setup = setup;

    public async Task StartAsync(CancellationToken cancellationToken)
    {
        _app = WebPageApp.Create(_setup);
        await _app.StartAsync(cancellationToken).ConfigureAwait(false);
    }

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
