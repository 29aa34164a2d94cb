using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>A reference readout whose readings are sometimes random numbers (any bit pattern) or unreadable replies.</summary>
internal sealed class GarbageReference(IReferenceReadout inner, GarbageGenerator garbage) : IReferenceReadout
{
    public async Task<double> ReadRawAsync(CancellationToken cancellationToken)
    {
        var value = await inner.ReadRawAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? await garbage.NumberOrFailAsync("reference").ConfigureAwait(false) : value;
    }
}
