using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Meter;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.SourceMeter;

/// <summary>
/// A source-measure unit with a channel scanner, driven in SCPI (see <see cref="SourceMeterCommands"/>). Before its first
/// command, and again after its port was reopened, it is reset and set to source current. Each setting of a current is
/// followed by a look at the error queue, so a refused current or channel is a fault that says what the SMU reported.
/// </summary>
public sealed class ScpiSourceMeter : ISourceMeter, IIdentifiableInstrument
{
    private readonly SourceMeterDefinition _definition;
    private int _configuredForOpen = -1;

    /// <summary>Creates the driver.</summary>
    public ScpiSourceMeter(SourceMeterDefinition definition, SerialLine line)
    {
        ArgumentNullException.ThrowIfNull(definition);
        ArgumentNullException.ThrowIfNull(line);
        _definition = definition;
        Line = line;
    }

    /// <inheritdoc/>
    public SerialLine Line { get; }

    /// <inheritdoc/>
    public Task<InstrumentIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(ScpiCommands.Identify, InstrumentIdentity.Parse, cancellationToken);

    /// <summary>Resets the SMU, sets it to source current with its output off, and checks its error queue.</summary>
    public async Task ConfigureAsync(CancellationToken cancellationToken)
    {
        await Line.SendAsync(ScpiCommands.Reset, cancellationToken).ConfigureAwait(false);
        await Line.SendAsync(ScpiCommands.ClearStatus, cancellationToken).ConfigureAwait(false);
        await Line.SendAsync(SourceMeterCommands.SourceCurrentFunction, cancellationToken).ConfigureAwait(false);
        await Line.SendAsync(SourceMeterCommands.OutputOff, cancellationToken).ConfigureAwait(false);
        await ThrowOnErrorsAsync($"rejected its configuration ({SourceMeterCommands.SourceCurrentFunction})", cancellationToken).ConfigureAwait(false);
        _configuredForOpen = Line.OpenCount;
    }

    /// <inheritdoc/>
    public async Task SetCurrentAsync(int channel, double amps, double complianceVolts, CancellationToken cancellationToken)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(channel, 1);
        if (!(amps > 0) || amps > _definition.MaxCurrentAmps)
        {
            throw new ArgumentOutOfRangeException(nameof(amps), amps, $"The current must be positive and at most {_definition.MaxCurrentAmps} A.");
        }

        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(complianceVolts);
        await EnsureConfiguredAsync(cancellationToken).ConfigureAwait(false);
        var message = string.Join(";:", SourceMeterCommands.CloseChannel(channel), SourceMeterCommands.VoltageCompliance(complianceVolts),
            SourceMeterCommands.SourceCurrent(amps), SourceMeterCommands.OutputOn);
        await Line.SendAsync(message, cancellationToken).ConfigureAwait(false);
        await ThrowOnErrorsAsync(string.Create(CultureInfo.InvariantCulture, $"refused {amps:G4} A on channel {channel}"), cancellationToken).ConfigureAwait(false);
    }

    /// <inheritdoc/>
    public async Task<SourceMeterReading> MeasureVoltsAsync(CancellationToken cancellationToken)
    {
        await EnsureConfiguredAsync(cancellationToken).ConfigureAwait(false);
        return await Line.QueryAsync(SourceMeterCommands.Read, ParseReading, cancellationToken).ConfigureAwait(false);
    }

    /// <inheritdoc/>
    public Task OutputOffAsync(CancellationToken cancellationToken) => Line.SendAsync(SourceMeterCommands.OutputOff, cancellationToken);

    /// <summary>Parses a <c>READ?</c> reply <c>volts,flag</c>.</summary>
    public static ReplyParse<SourceMeterReading> ParseReading(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        var comma = reply.IndexOf(',', StringComparison.Ordinal);
        var flag = comma < 0 ? default : WireNumber.TrimBlanks(reply.AsSpan(comma + 1));
        if (comma < 1
            || !WireNumber.TryParseDecimal(reply.AsSpan(0, comma), out var volts) || !double.IsFinite(volts)
            || !(flag is "0" or "1"))
        {
            return ReplyParse<SourceMeterReading>.NotUnderstood("a reading is <volts NR3>,<compliance 0|1>");
        }

        return ReplyParse<SourceMeterReading>.Ok(new SourceMeterReading(volts, flag is "1"));
    }

    private async Task EnsureConfiguredAsync(CancellationToken cancellationToken)
    {
        if (_configuredForOpen != Line.OpenCount)
        {
            await ConfigureAsync(cancellationToken).ConfigureAwait(false);
        }
    }

    private async Task ThrowOnErrorsAsync(string what, CancellationToken cancellationToken)
    {
        var errors = new List<string>();
        for (var i = 0; i < 20; i++)
        {
            var entry = await Line.QueryOnceAsync(ScpiCommands.ReadError, ScpiVoltmeter.ParseErrorEntry, cancellationToken).ConfigureAwait(false);
            if (entry is null)
            {
                break;
            }

            errors.Add(entry);
        }

        if (errors.Count > 0)
        {
            throw new InstrumentFaultException(Line.Instrument, InstrumentFaultKind.InstrumentError, $"{what}: error queue {string.Join(" ", errors)}");
        }
    }
}
