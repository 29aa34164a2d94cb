using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A reference readout that never answers: every read ends in <see cref="InstrumentFaultKind.NoAnswer"/>.</summary>
public sealed class SilentReferenceReadout : IReferenceReadout
{
    /// <inheritdoc/>
    public Task<double> ReadRawAsync(CancellationToken cancellationToken)
        => Task.FromException<double>(new InstrumentFaultException("reference", InstrumentFaultKind.NoAnswer, "no answer from the reference readout"));
}
