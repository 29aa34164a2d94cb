using Microsoft.Extensions.Hosting;

namespace LineTest.Factory.Forwarding;

/// <summary>The hosted station's forwarder: runs <see cref="StationForwardingLoop"/> in the background until the host stops.</summary>
public sealed class FactoryForwardingService(StationForwardingLoop loop) : BackgroundService
{
    /// <inheritdoc />
    protected override Task ExecuteAsync(CancellationToken stoppingToken) => loop.RunAsync(stoppingToken);
}
