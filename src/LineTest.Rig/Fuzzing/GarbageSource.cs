using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>A temperature source whose replies are sometimes garbage: random numbers, random status text, unreadable acknowledgements.</summary>
internal sealed class GarbageSource(ITemperatureSource inner, GarbageGenerator garbage) : ITemperatureSource
{
    public Task SetSetpointAsync(double celsius, CancellationToken cancellationToken) =>
        garbage.Hit() ? garbage.Fail("source") : inner.SetSetpointAsync(celsius, cancellationToken);

    public async Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
    {
        var value = await inner.ReadTemperatureAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? await garbage.NumberOrFailAsync("source").ConfigureAwait(false) : value;
    }

    public async Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken)
    {
        var status = await inner.ReadStatusAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? new SourceStatus(garbage.Number(), garbage.Number(), garbage.Text()) : status;
    }

    public Task GoToStandbyAsync(CancellationToken cancellationToken) =>
        garbage.Hit() ? garbage.Fail("source") : inner.GoToStandbyAsync(cancellationToken);
}
