using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A unit link whose replies are corrupted: every command ends in <see cref="InstrumentFaultKind.GarbageReply"/>.</summary>
public sealed class GarbageReplyUnitLink : IUnitLink
{
    private static InstrumentFaultException Fault(string command)
        => new("unit", InstrumentFaultKind.GarbageReply, $"reply to {command} failed its checksum");

    /// <inheritdoc/>
    public Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken) => Task.FromException<UnitIdentity>(Fault("identify"));

    /// <inheritdoc/>
    public Task<long> ReadRawAsync(CancellationToken cancellationToken) => Task.FromException<long>(Fault("read raw"));

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken) => Task.FromException<double>(Fault("read temperature"));

    /// <inheritdoc/>
    public Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken) => Task.FromException(Fault("write trim"));

    /// <inheritdoc/>
    public Task StoreAsync(CancellationToken cancellationToken) => Task.FromException(Fault("store"));

    /// <inheritdoc/>
    public Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken)
        => Task.FromException<IReadOnlyDictionary<string, long>>(Fault("read back"));
}
