using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Source;

/// <summary>
/// A dry block, bath or chamber on a serial line, speaking <see cref="SourceCommands"/>. A setpoint outside the
/// fixture's safe range is refused before anything is sent: the source must never be asked for a temperature that
/// can burn or freeze skin. The sequence checker should have caught it, but the refusal is an
/// <see cref="InstrumentFaultException"/> (kind <see cref="InstrumentFaultKind.Other"/>) rather than an argument
/// exception so that the coordinator handles it like a lost source: the batch ends in <c>error</c> and the source
/// goes to standby.
/// </summary>
public sealed class SerialTemperatureSource : ITemperatureSource, IIdentifiableInstrument
{
    private readonly SourceDefinition _source;

    /// <summary>Creates the driver.</summary>
    /// <param name="source">The fixture's source, for its safe range.</param>
    /// <param name="line">The source's serial line.</param>
    public SerialTemperatureSource(SourceDefinition source, SerialLine line)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(line);
        _source = source;
        Line = line;
    }

    /// <inheritdoc/>
    public SerialLine Line { get; }

    /// <inheritdoc/>
    public Task<InstrumentIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(SourceCommands.Identify, Replies.ParseIdentity, cancellationToken);

    /// <inheritdoc/>
    /// <exception cref="InstrumentFaultException">The setpoint is not finite or lies outside the fixture's safe range; nothing was sent.</exception>
    public Task SetSetpointAsync(double celsius, CancellationToken cancellationToken)
    {
        if (!double.IsFinite(celsius) || celsius < _source.SafeMinC || celsius > _source.SafeMaxC)
        {
            return Task.FromException(new InstrumentFaultException(Line.Instrument, InstrumentFaultKind.Other, string.Create(CultureInfo.InvariantCulture,
                $"setpoint {celsius} °C refused, outside the fixture's safe range {_source.SafeMinC} to {_source.SafeMaxC} °C; nothing was sent (check the sequence against the fixture)")));
        }

        return Line.CommandAsync(SourceCommands.SetSetpoint(celsius), Replies.ParseOk, cancellationToken);
    }

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(SourceCommands.ReadTemperature, Replies.ParseNumber, cancellationToken);

    /// <inheritdoc/>
    public Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(SourceCommands.ReadStatus, ParseStatus, cancellationToken);

    /// <inheritdoc/>
    public Task GoToStandbyAsync(CancellationToken cancellationToken)
        => Line.CommandAsync(SourceCommands.Standby, Replies.ParseOk, cancellationToken);

    /// <summary>Parses a status reply: <c>setpoint,actual,OK</c> or <c>setpoint,actual,FAULT text</c>.</summary>
    public static ReplyParse<SourceStatus> ParseStatus(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        if (Replies.IsError(reply, out var error))
        {
            return ReplyParse<SourceStatus>.Error(error);
        }

        var fields = reply.Split(',', 3);
        if (fields.Length != 3)
        {
            return ReplyParse<SourceStatus>.NotUnderstood("a status has three fields: setpoint,actual,state");
        }

        var setpoint = Replies.ParseNumber(fields[0]);
        var actual = Replies.ParseNumber(fields[1]);
        if (!setpoint.IsOk || !actual.IsOk)
        {
            return ReplyParse<SourceStatus>.NotUnderstood("setpoint and actual temperature must be numbers");
        }

        string? fault;
        if (fields[2] == SourceCommands.NoFault)
        {
            fault = null;
        }
        else if (fields[2].StartsWith(SourceCommands.FaultPrefix, StringComparison.Ordinal) && fields[2].Length > SourceCommands.FaultPrefix.Length)
        {
            fault = fields[2][SourceCommands.FaultPrefix.Length..];
        }
        else
        {
            return ReplyParse<SourceStatus>.NotUnderstood("the state must be OK or FAULT and a text");
        }

        return ReplyParse<SourceStatus>.Ok(new SourceStatus(setpoint.Value, actual.Value, fault));
    }
}
