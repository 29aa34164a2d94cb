namespace LineTest.Rig.Serial.Transport;

/// <summary>An instrument on a serial line that can say who it is (for <c>linetest probe</c>).</summary>
public interface IIdentifiableInstrument
{
    /// <summary>The line the instrument is on.</summary>
    SerialLine Line { get; }

    /// <summary>Asks the instrument for its identity.</summary>
    Task<InstrumentIdentity> IdentifyAsync(CancellationToken cancellationToken);
}
