using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>
/// A source-measure unit whose readings are sometimes random numbers (any bit pattern, in or out of compliance) or
/// unreadable replies, and whose commands are sometimes refused as unreadable.
/// </summary>
internal sealed class GarbageSourceMeter(ISourceMeter inner, GarbageGenerator garbage) : ISourceMeter
{
    private const string Name = "source-measure unit";

    public async Task SetCurrentAsync(int channel, double amps, double complianceVolts, CancellationToken cancellationToken)
    {
        await inner.SetCurrentAsync(channel, amps, complianceVolts, cancellationToken).ConfigureAwait(false);
        if (garbage.Hit())
        {
            await garbage.Fail(Name).ConfigureAwait(false);
        }
    }

    public async Task<SourceMeterReading> MeasureVoltsAsync(CancellationToken cancellationToken)
    {
        var reading = await inner.MeasureVoltsAsync(cancellationToken).ConfigureAwait(false);
        if (!garbage.Hit())
        {
            return reading;
        }

        var volts = await garbage.NumberOrFailAsync(Name).ConfigureAwait(false);
        return new SourceMeterReading(volts, garbage.Integer() % 2 == 0);
    }

    public async Task OutputOffAsync(CancellationToken cancellationToken)
    {
        await inner.OutputOffAsync(cancellationToken).ConfigureAwait(false);
        if (garbage.Hit())
        {
            await garbage.Fail(Name).ConfigureAwait(false);
        }
    }
}
