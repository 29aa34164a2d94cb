using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A voltmeter whose replies cannot be parsed: every read ends in <see cref="InstrumentFaultKind.GarbageReply"/>.</summary>
public sealed class GarbageReplyMeter : IVoltmeter
{
    /// <inheritdoc/>
    public Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
        => Task.FromException<double>(new InstrumentFaultException("meter", InstrumentFaultKind.GarbageReply, $"reply to channel {channel} read was not a number"));
}
