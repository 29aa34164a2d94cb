using System.Globalization;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Meter;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// The simulated scanning voltmeter answering SCPI on a pseudo-terminal: a message is one or more commands separated
/// by ';'; settings are silent; anything wrong goes to the error queue (SCPI-1999 error numbers), where
/// <c>SYST:ERR?</c> finds it.
/// </summary>
public sealed class MeterTwin : IDisposable
{
    /// <summary>What the twin answers to <c>*IDN?</c> (invented).</summary>
    public static readonly InstrumentIdentity Identity = new("LineTest", "simulated scanning DMM", "SIM-DMM-1", "1.0");

    private static readonly double[] Ranges = [0.1, 1, 10, 100, 1000];
    private static readonly double[] Plcs = [0.02, 0.2, 1, 10, 100];

    private readonly SimulatedVoltmeter _meter;

    // Concurrency: the fields below are touched by the server thread and by tests (RefuseReadings), under _gate.
    private readonly Lock _gate = new();
    private readonly Queue<string> _errors = new();
    private int? _closedChannel;
    private double _rangeVolts = 10;
    private double _plc = 1;
    private string? _refusal;

    /// <summary>Starts serving <paramref name="meter"/> on the port <paramref name="linkPath"/>.</summary>
    public MeterTwin(SimulatedVoltmeter meter, string linkPath, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(meter);
        _meter = meter;
        Server = new LineServer("meter", linkPath, PlainFraming.Instance, Handle, logger);
    }

    /// <summary>The line server.</summary>
    public LineServer Server { get; }

    /// <summary>The range the meter was last configured to, volts.</summary>
    public double RangeVolts
    {
        get
        {
            lock (_gate)
            {
                return _rangeVolts;
            }
        }
    }

    /// <summary>The integration time it was last configured to, PLC.</summary>
    public double IntegrationPlc
    {
        get
        {
            lock (_gate)
            {
                return _plc;
            }
        }
    }

    /// <summary>
    /// From now on every <c>READ?</c> is refused: no reply, and <paramref name="error"/> (e.g. <c>-240,"Hardware error"</c>)
    /// goes to the error queue, as a meter with a failed input stage does. Null to heal it.
    /// </summary>
    public void RefuseReadings(string? error)
    {
        lock (_gate)
        {
            _refusal = error;
        }
    }

    /// <inheritdoc/>
    public void Dispose() => Server.Dispose();

    private TwinReply Handle(string message)
    {
        lock (_gate)
        {
            return ScpiMessage.Answer(message, Execute);
        }
    }

    // Under _gate. Null: a setting, no reply.
    private TwinReply? Execute(string header, string argument)
    {
        switch (header)
        {
            case "*IDN?":
                return TwinReply.Answer(Identity.ToString());
            case "*RST":
                _rangeVolts = 10;
                _plc = 1;
                _closedChannel = null;
                return null;
            case "*CLS":
                _errors.Clear();
                return null;
            case "*OPC?":
                return TwinReply.Answer("1");
            case "SYST:ERR?":
                return TwinReply.Answer(_errors.Count > 0 ? _errors.Dequeue() : ScpiCommands.NoError);
            case "CONF:VOLT:DC":
                SetFrom(argument, Ranges, v => _rangeVolts = v);
                return null;
            case "VOLT:DC:NPLC":
                SetFrom(argument, Plcs, v => _plc = v);
                return null;
            case "ROUT:CLOS":
                if (argument.StartsWith("(@", StringComparison.Ordinal) && argument.EndsWith(')')
                    && int.TryParse(argument.AsSpan(2, argument.Length - 3), NumberStyles.None, CultureInfo.InvariantCulture, out var channel) && channel > 0)
                {
                    _closedChannel = channel;
                }
                else
                {
                    _errors.Enqueue(ScpiCommands.ErrorEntry(-224, $"Illegal parameter value; channel list '{argument}'"));
                }

                return null;
            case "READ?":
                return Read();
            default:
                _errors.Enqueue(ScpiCommands.ErrorEntry(-113, $"Undefined header; '{header}'"));
                return null;
        }
    }

    private TwinReply Read()
    {
        if (_refusal is { } refusal)
        {
            _errors.Enqueue(refusal);
            return TwinReply.Silence;
        }

        if (_closedChannel is not { } channel)
        {
            _errors.Enqueue(ScpiCommands.ErrorEntry(-221, "Settings conflict; no scanner channel closed"));
            return TwinReply.Silence;
        }

        string? overload = null;
        var reply = SimulatedAnswer.From(() => _meter.ReadDcVoltsAsync(channel, default), ScpiCommands.Nr3, text => overload = text);
        if (overload is not null)
        {
            // The simulated meter reported an error (an overload): SCPI answers 9.9E37 and queues the reason.
            _errors.Enqueue(ScpiCommands.ErrorEntry(-222, $"Data out of range; {overload}"));
            return TwinReply.Answer(ScpiCommands.Nr3(ScpiCommands.OverloadVolts));
        }

        return reply;
    }

    private void SetFrom(string argument, double[] allowed, Action<double> set)
    {
        if (double.TryParse(argument, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) && allowed.Contains(value))
        {
            set(value);
        }
        else
        {
            _errors.Enqueue(ScpiCommands.ErrorEntry(-222, $"Data out of range; '{argument}'"));
        }
    }
}
