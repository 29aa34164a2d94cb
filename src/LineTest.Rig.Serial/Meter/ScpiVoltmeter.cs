using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Meter;

/// <summary>
/// A DC voltmeter with a channel scanner, driven in SCPI. Before its first reading, and again after its port was
/// reopened, it is reset and configured from the fixture (range, NPLC) and its error queue must be empty. A reading
/// closes the slot's channel and reads in one message. When a reading fails or overloads, the error queue is read
/// so that the fault says what the meter itself reported.
/// </summary>
public sealed class ScpiVoltmeter : IVoltmeter, IIdentifiableInstrument
{
    private readonly MeterDefinition _meter;

    // Concurrency: the coordinator reads one channel at a time; _configuredForOpen is only a cache of that state.
    private int _configuredForOpen = -1;

    /// <summary>Creates the driver.</summary>
    /// <param name="meter">The fixture's meter (range, integration time).</param>
    /// <param name="line">The meter's serial line.</param>
    public ScpiVoltmeter(MeterDefinition meter, SerialLine line)
    {
        ArgumentNullException.ThrowIfNull(meter);
        ArgumentNullException.ThrowIfNull(line);
        _meter = meter;
        Line = line;
    }

    /// <inheritdoc/>
    public SerialLine Line { get; }

    /// <inheritdoc/>
    public Task<InstrumentIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(ScpiCommands.Identify, InstrumentIdentity.Parse, cancellationToken);

    /// <summary>Resets and configures the meter; throws <see cref="InstrumentFaultKind.InstrumentError"/> if it rejects the settings.</summary>
    public async Task ConfigureAsync(CancellationToken cancellationToken)
    {
        var settings = new[] { ScpiCommands.ConfigureDcVolts(_meter.RangeVolts), ScpiCommands.IntegrationPlc(_meter.IntegrationPlc) };
        await Line.SendAsync(ScpiCommands.Reset, cancellationToken).ConfigureAwait(false);
        await Line.SendAsync(ScpiCommands.ClearStatus, cancellationToken).ConfigureAwait(false);
        foreach (var setting in settings)
        {
            await Line.SendAsync(setting, cancellationToken).ConfigureAwait(false);
        }

        var errors = await ReadErrorQueueAsync(cancellationToken).ConfigureAwait(false);
        if (errors.Count > 0)
        {
            throw new InstrumentFaultException(Line.Instrument, InstrumentFaultKind.InstrumentError,
                $"rejected its configuration ({string.Join("; ", settings)}): error queue {string.Join(" ", errors)}");
        }

        _configuredForOpen = Line.OpenCount;
    }

    /// <summary>Reads the whole error queue (at most 20 entries), oldest first; empty when the meter has no error.</summary>
    public async Task<IReadOnlyList<string>> ReadErrorQueueAsync(CancellationToken cancellationToken)
    {
        var errors = new List<string>();
        for (var i = 0; i < 20; i++)
        {
            var entry = await Line.QueryOnceAsync(ScpiCommands.ReadError, ParseErrorEntry, cancellationToken).ConfigureAwait(false);
            if (entry is null)
            {
                break;
            }

            errors.Add(entry);
        }

        return errors;
    }

    /// <inheritdoc/>
    public async Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(channel, 1);
        while (true)
        {
            if (_configuredForOpen != Line.OpenCount)
            {
                await ConfigureAsync(cancellationToken).ConfigureAwait(false);
            }

            double volts;
            try
            {
                volts = await Line.QueryAsync(ScpiCommands.ReadChannel(channel), ParseReading, cancellationToken).ConfigureAwait(false);
            }
            catch (InstrumentFaultException fault) when (fault.Kind is InstrumentFaultKind.NoAnswer or InstrumentFaultKind.GarbageReply)
            {
                var queue = await TryReadErrorQueueAsync(cancellationToken).ConfigureAwait(false);
                if (queue is { Count: > 0 })
                {
                    throw new InstrumentFaultException(Line.Instrument, InstrumentFaultKind.InstrumentError,
                        string.Create(CultureInfo.InvariantCulture, $"reading channel {channel} failed and the error queue holds {string.Join(" ", queue)}"), fault);
                }

                throw;
            }

            if (_configuredForOpen != Line.OpenCount)
            {
                // The port was reopened during the reading: the meter may have restarted unconfigured. Read again.
                continue;
            }

            if (Math.Abs(volts) >= ScpiCommands.OverloadVolts)
            {
                var queue = await TryReadErrorQueueAsync(cancellationToken).ConfigureAwait(false);
                var detail = queue is { Count: > 0 } ? $"; error queue {string.Join(" ", queue)}" : string.Empty;
                throw new InstrumentFaultException(Line.Instrument, InstrumentFaultKind.InstrumentError,
                    string.Create(CultureInfo.InvariantCulture, $"channel {channel} overload on the {_meter.RangeVolts} V range{detail}: check the unit's wiring and the meter range"));
            }

            return volts;
        }
    }

    /// <summary>
    /// Parses an error-queue entry <c>code,"text"</c> (SCPI-1999 SYSTem:ERRor): null for code 0, else the entry as it
    /// stands. Anything else is garbage, so that a garbled reply is never taken for an empty queue.
    /// </summary>
    public static ReplyParse<string?> ParseErrorEntry(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        var comma = reply.IndexOf(',', StringComparison.Ordinal);
        if (comma < 1 || !WireNumber.TryParseWhole(reply.AsSpan(0, comma), out var code) || code is < int.MinValue or > int.MaxValue
            || reply.Length < comma + 3 || reply[comma + 1] != '"' || reply[^1] != '"')
        {
            return ReplyParse<string?>.NotUnderstood("an error-queue entry is code,\"text\"");
        }

        return ReplyParse<string?>.Ok(code == 0 ? null : reply);
    }

    /// <summary>Parses a reading: an NR3 number; the SCPI overload value 9.9E37 (or larger) is a reading, judged by the caller.</summary>
    public static ReplyParse<double> ParseReading(string reply)
        => WireNumber.TryParseDecimal(reply, out var volts)
            ? ReplyParse<double>.Ok(volts)
            : ReplyParse<double>.NotUnderstood("not an NR3 number");

    private async Task<IReadOnlyList<string>?> TryReadErrorQueueAsync(CancellationToken cancellationToken)
    {
        try
        {
            return await ReadErrorQueueAsync(cancellationToken).ConfigureAwait(false);
        }
        catch (InstrumentFaultException)
        {
            // A meter that cannot answer the queue either: the original fault says more.
            return null;
        }
    }
}
