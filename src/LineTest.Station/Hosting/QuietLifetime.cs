using Microsoft.Extensions.Hosting;

namespace LineTest.Station.Hosting;

/// <summary>
/// The hosted station's lifetime: it does not listen for Ctrl-C or SIGTERM itself (the default console lifetime would
/// stop the host at once); the station handles them through <see cref="StopSignals"/> and stops the host when its shift ends.
/// </summary>
public sealed class QuietLifetime : IHostLifetime
{
    /// <inheritdoc />
    public Task WaitForStartAsync(CancellationToken cancellationToken) => Task.CompletedTask;

    /// <inheritdoc />
    public Task StopAsync(CancellationToken cancellationToken) => Task.CompletedTask;
}
