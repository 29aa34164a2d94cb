using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A voltmeter that never answers: every read ends in <see cref="InstrumentFaultKind.NoAnswer"/>.</summary>
public sealed class SilentMeter : IVoltmeter
{
    private int _reads;

    /// <summary>How many reads were attempted.</summary>
    public int Reads => Volatile.Read(ref _reads);

    /// <inheritdoc/>
    public Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
    {
        Interlocked.Increment(ref _reads);
        return Task.FromException<double>(new InstrumentFaultException("meter", InstrumentFaultKind.NoAnswer, $"no answer reading channel {channel}"));
    }
}
