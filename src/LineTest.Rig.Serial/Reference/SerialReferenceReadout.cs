using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Reference;

/// <summary>
/// A reference thermometer readout on a serial line, speaking <see cref="ReferenceCommands"/>. It returns the raw
/// value (Ω, mV or °C) and insists on the unit the fixture's sensor needs: a readout set to the wrong function is a
/// reply that does not make sense, not a temperature.
/// </summary>
public sealed class SerialReferenceReadout : IReferenceReadout, IIdentifiableInstrument
{
    private readonly string _unit;

    /// <summary>Creates the driver.</summary>
    /// <param name="line">The readout's serial line.</param>
    /// <param name="unit">The unit every reading must carry (<see cref="ReferenceCommands.UnitFor"/>).</param>
    public SerialReferenceReadout(SerialLine line, string unit)
    {
        ArgumentNullException.ThrowIfNull(line);
        ArgumentException.ThrowIfNullOrWhiteSpace(unit);
        Line = line;
        _unit = unit;
    }

    /// <inheritdoc/>
    public SerialLine Line { get; }

    /// <inheritdoc/>
    public Task<InstrumentIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(ReferenceCommands.Identify, Replies.ParseIdentity, cancellationToken);

    /// <inheritdoc/>
    public Task<double> ReadRawAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(ReferenceCommands.Measure, reply => ParseMeasurement(reply, _unit), cancellationToken);

    /// <summary>Parses a <c>MEAS?</c> reply <c>value,unit</c> that must carry <paramref name="unit"/> (or an error reply).</summary>
    public static ReplyParse<double> ParseMeasurement(string reply, string unit)
    {
        ArgumentNullException.ThrowIfNull(reply);
        ArgumentNullException.ThrowIfNull(unit);
        if (Replies.IsError(reply, out var error))
        {
            return ReplyParse<double>.Error(error);
        }

        var comma = reply.IndexOf(',', StringComparison.Ordinal);
        if (comma < 0)
        {
            return ReplyParse<double>.NotUnderstood("a reading is value,unit");
        }

        var reported = reply[(comma + 1)..];
        if (reported != unit)
        {
            return ReplyParse<double>.NotUnderstood($"the readout reports {reported} but the fixture's sensor needs {unit}: set the readout's function");
        }

        return Replies.ParseNumber(reply[..comma]);
    }
}
