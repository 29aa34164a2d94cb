using System.Net;
using System.Net.Sockets;
using LineTest.TestSupport;
using LineTest.Web.Access;
using LineTest.Web.Hosting;
using LineTest.Web.Tests.Support;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Tests.Hosting;

public sealed class StationWebPageServiceTests
{
    // Found when starting a station whose live-page port another program held: the page's failed bind ended the whole
    // station (unhandled exception, exit 134) before a unit could be tested. The page is a window on the results; the
    // station tests without it, and says why.
    [Fact]
    public async Task StartAsync_PortAlreadyInUse_StationGoesOnWithoutThePageAndSaysWhy()
    {
        using var holder = new TcpListener(IPAddress.Loopback, 0);
        holder.Start();
        var port = ((IPEndPoint)holder.LocalEndpoint).Port;
        var log = new RecordingLoggerProvider();
        using var loggers = LoggerFactory.Create(b => b.AddProvider(log));
        var listen = ListenAddress.Parse($"127.0.0.1:{port}", out _)!;
        await using var page = new StationWebPageService(StationWebPageService.Setup(listen, new WebPageOptions(), Some.TempDirectory(), TimeProvider.System, loggers));

        var ex = await Record.ExceptionAsync(() => page.StartAsync(CancellationToken.None));

        Assert.Null(ex);
        Assert.Contains(log.Messages, m => m.EventId == 4091 && m.Message.Contains($"127.0.0.1:{port}", StringComparison.Ordinal) && m.Message.Contains("without the live page", StringComparison.Ordinal));
        await page.StopAsync(CancellationToken.None);
    }
}
