using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>A voltmeter whose readings are sometimes random numbers (any bit pattern) or unreadable replies.</summary>
internal sealed class GarbageVoltmeter(IVoltmeter inner, GarbageGenerator garbage) : IVoltmeter
{
    public async Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
    {
        var value = await inner.ReadDcVoltsAsync(channel, cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? await garbage.NumberOrFailAsync("meter").ConfigureAwait(false) : value;
    }
}
