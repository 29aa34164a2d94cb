using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>
/// A unit link whose replies are sometimes garbage: random serial, product and firmware text, random counts and
/// temperatures, random read-back registers, unreadable acknowledgements.
/// </summary>
internal sealed class GarbageUnitLink(IUnitLink inner, GarbageGenerator garbage, string name) : IUnitLink
{
    public async Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken)
    {
        var identity = await inner.IdentifyAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? new UnitIdentity(garbage.Text(), garbage.Text(), garbage.Text()) : identity;
    }

    public async Task<long> ReadRawAsync(CancellationToken cancellationToken)
    {
        var value = await inner.ReadRawAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? garbage.Integer() : value;
    }

    public async Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
    {
        var value = await inner.ReadTemperatureAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? await garbage.NumberOrFailAsync(name).ConfigureAwait(false) : value;
    }

    public Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken) =>
        garbage.Hit() ? garbage.Fail(name) : inner.WriteTrimAsync(values, cancellationToken);

    public Task StoreAsync(CancellationToken cancellationToken) =>
        garbage.Hit() ? garbage.Fail(name) : inner.StoreAsync(cancellationToken);

    public async Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken)
    {
        var values = await inner.ReadBackAsync(cancellationToken).ConfigureAwait(false);
        return garbage.Hit() ? garbage.Registers(values.Keys) : values;
    }
}
