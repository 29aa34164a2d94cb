using System.Globalization;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Meter;
using LineTest.Rig.Serial.SourceMeter;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// The simulated source-measure unit answering SCPI on a pseudo-terminal (<see cref="SourceMeterCommands"/>): a message
/// is one or more commands separated by ';'; settings are silent; anything wrong goes to the error queue.
/// </summary>
public sealed class SourceMeterTwin : IDisposable
{
    /// <summary>What the twin answers to <c>*IDN?</c> (invented).</summary>
    public static readonly InstrumentIdentity Identity = new("LineTest", "simulated source-measure unit", "SIM-SMU-1", "1.0");

    private readonly SimulatedSourceMeter _smu;

    // Concurrency: touched only on the server thread, under _gate.
    private readonly Lock _gate = new();
    private readonly Queue<string> _errors = new();
    private int? _channel;
    private double _amps;
    private double _complianceVolts = 2.0;
    private bool _sourceCurrent;
    private bool _on;

    /// <summary>Starts serving <paramref name="smu"/> on the port <paramref name="linkPath"/>.</summary>
    public SourceMeterTwin(SimulatedSourceMeter smu, string linkPath, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(smu);
        _smu = smu;
        Server = new LineServer("source-measure unit", linkPath, PlainFraming.Instance, Handle, logger);
    }

    /// <summary>The line server.</summary>
    public LineServer Server { get; }

    /// <inheritdoc/>
    public void Dispose() => Server.Dispose();

    private TwinReply Handle(string message)
    {
        lock (_gate)
        {
            return ScpiMessage.Answer(message, Execute);
        }
    }

    private TwinReply? Execute(string header, string argument)
    {
        switch (header)
        {
            case "*IDN?":
                return TwinReply.Answer(Identity.ToString());
            case "*RST":
                _channel = null;
                _on = false;
                _sourceCurrent = false;
                return Apply();
            case "*CLS":
                _errors.Clear();
                return null;
            case "SYST:ERR?":
                return TwinReply.Answer(_errors.Count > 0 ? _errors.Dequeue() : ScpiCommands.NoError);
            case "SOUR:FUNC":
                _sourceCurrent = argument.Equals("CURR", StringComparison.OrdinalIgnoreCase);
                if (!_sourceCurrent)
                {
                    _errors.Enqueue(ScpiCommands.ErrorEntry(-224, $"Illegal parameter value; function '{argument}' (this twin sources current only)"));
                }

                return null;
            case "SOUR:CURR":
                return SetNumber(argument, v => _amps = v);
            case "SENS:VOLT:PROT":
                return SetNumber(argument, v => _complianceVolts = v);
            case "ROUT:CLOS":
                if (argument.StartsWith("(@", StringComparison.Ordinal) && argument.EndsWith(')')
                    && int.TryParse(argument.AsSpan(2, argument.Length - 3), NumberStyles.None, CultureInfo.InvariantCulture, out var channel) && channel > 0)
                {
                    _channel = channel;
                    return Apply();
                }

                _errors.Enqueue(ScpiCommands.ErrorEntry(-224, $"Illegal parameter value; channel list '{argument}'"));
                return null;
            case "OUTP":
                if (argument.Equals("ON", StringComparison.OrdinalIgnoreCase))
                {
                    if (!_sourceCurrent || _channel is null)
                    {
                        _errors.Enqueue(ScpiCommands.ErrorEntry(-221, "Settings conflict; set SOUR:FUNC CURR and close a channel first"));
                        return null;
                    }

                    _on = true;
                }
                else
                {
                    _on = false;
                }

                return Apply();
            case "READ?":
                return SimulatedAnswer.From(() => _smu.MeasureVoltsAsync(default), r => SourceMeterCommands.Reading(r.Volts, r.InCompliance),
                    text => ScpiCommands.ErrorEntry(-240, text));
            default:
                _errors.Enqueue(ScpiCommands.ErrorEntry(-113, $"Undefined header; '{header}'"));
                return null;
        }
    }

    private TwinReply? SetNumber(string argument, Action<double> set)
    {
        if (double.TryParse(argument, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) && double.IsFinite(value))
        {
            set(value);
            return Apply();
        }

        _errors.Enqueue(ScpiCommands.ErrorEntry(-222, $"Data out of range; '{argument}'"));
        return null;
    }

    /// <summary>Passes the present settings to the simulated SMU; a refusal goes to the error queue, a fault is answered as one.</summary>
    private TwinReply? Apply()
    {
        Task task;
        try
        {
            task = _on && _channel is { } channel
                ? _smu.SetCurrentAsync(channel, _amps, _complianceVolts, default)
                : _smu.OutputOffAsync(default);
        }
        catch (InstrumentFaultException fault)
        {
            return SimulatedAnswer.ForFault(fault, text => text, null);
        }

        if (task.IsFaulted && task.Exception?.InnerException is InstrumentFaultException f)
        {
            if (f.Kind == InstrumentFaultKind.InstrumentError)
            {
                _errors.Enqueue(ScpiCommands.ErrorEntry(-222, $"Data out of range; {SimulatedAnswer.WithoutInstrument(f)}"));
                _on = false;
                return null;
            }

            return SimulatedAnswer.ForFault(f, text => text, null);
        }

        return null;
    }
}
