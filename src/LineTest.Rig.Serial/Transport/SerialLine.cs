using System.IO.Ports;
using System.Text;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Transport;

/// <summary>
/// A line-oriented command/reply link to one instrument over one serial port: 8N1 at the fixture's baud rate, one
/// command line out, one reply line back within the port's timeout. Idempotent queries are retried a bounded number
/// of times after silence, a garbled reply or a lost port; commands that change something never are. A lost port is
/// closed and reopened on the next command. Every failure is an <see cref="InstrumentFaultException"/> whose message
/// names the instrument, the port, the command and what to check.
/// </summary>
/// <remarks>
/// One exchange at a time (<see cref="_exclusive"/>); the blocking port I/O runs on the thread pool, so a caller on
/// the simulator's virtual clock never blocks its timer thread. Timeouts are wall time from the injected clock.
/// </remarks>
public sealed class SerialLine : IDisposable
{
    /// <summary>Default longest reply line, characters; a longer one is garbage.</summary>
    public const int DefaultMaxLineLength = 256;

    private readonly PortDefinition _port;
    private readonly ILineFraming _framing;
    private readonly ILogger _logger;
    private readonly TimeProvider _clock;
    private readonly int _maxLineLength;

    // Concurrency: _serial, _opened and _disposed are touched only while _exclusive is held (Dispose takes it too).
    private readonly SemaphoreSlim _exclusive = new(1, 1);
    private SerialPort? _serial;
    private int _opened;
    private bool _disposed;

    /// <summary>Creates a line; the port is opened on the first command.</summary>
    /// <param name="name">What the instrument is called in messages, e.g. <c>source</c>, <c>unit slot 3</c>.</param>
    /// <param name="port">Port name, baud, timeout per command and retries.</param>
    /// <param name="framing">How a message is framed in a line.</param>
    /// <param name="logger">Every exchange is logged at Debug.</param>
    /// <param name="clock">Wall clock for timeouts (<see cref="TimeProvider.System"/>; never a virtual clock).</param>
    /// <param name="maxLineLength">Longest acceptable reply line.</param>
    public SerialLine(string name, PortDefinition port, ILineFraming framing, ILogger logger, TimeProvider clock, int maxLineLength = DefaultMaxLineLength)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentNullException.ThrowIfNull(port);
        ArgumentNullException.ThrowIfNull(framing);
        ArgumentNullException.ThrowIfNull(logger);
        ArgumentNullException.ThrowIfNull(clock);
        ArgumentException.ThrowIfNullOrWhiteSpace(port.Name);
        ArgumentOutOfRangeException.ThrowIfLessThan(port.Baud, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(port.TimeoutMs, 1);
        ArgumentOutOfRangeException.ThrowIfNegative(port.Retries);
        ArgumentOutOfRangeException.ThrowIfLessThan(maxLineLength, 1);
        Name = name;
        _port = port;
        _framing = framing;
        _logger = logger;
        _clock = clock;
        _maxLineLength = maxLineLength;
        Instrument = $"{name} on {port.Name}";
    }

    /// <summary>The instrument's name, e.g. <c>source</c>.</summary>
    public string Name { get; }

    /// <summary>The name used in faults: <c>source on /dev/ttyUSB0</c>.</summary>
    public string Instrument { get; }

    /// <summary>The port settings.</summary>
    public PortDefinition Port => _port;

    /// <summary>How many times the port has been opened; a driver that configures its instrument re-does it when this changes.</summary>
    public int OpenCount => Volatile.Read(ref _opened);

    /// <summary>Sends an idempotent query and parses its reply; silence, garbage and a lost port are retried.</summary>
    public Task<T> QueryAsync<T>(string command, Func<string, ReplyParse<T>> parse, CancellationToken cancellationToken)
        => ExchangeAsync(command, parse, 1 + _port.Retries, cancellationToken);

    /// <summary>Sends a query once, without retries (e.g. reading an error queue, which a repeat would change).</summary>
    public Task<T> QueryOnceAsync<T>(string command, Func<string, ReplyParse<T>> parse, CancellationToken cancellationToken)
        => ExchangeAsync(command, parse, 1, cancellationToken);

    /// <summary>Sends a command that changes something and parses its acknowledgement. Never retried.</summary>
    public Task<T> CommandAsync<T>(string command, Func<string, ReplyParse<T>> parse, CancellationToken cancellationToken)
        => ExchangeAsync(command, parse, 1, cancellationToken);

    /// <summary>Sends a command that has no reply (a SCPI setting). Never retried.</summary>
    public async Task SendAsync(string command, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(command);
        await _exclusive.WaitAsync(cancellationToken).ConfigureAwait(false);
        try
        {
            await Task.Run(() => Send(command), cancellationToken).ConfigureAwait(false);
        }
        finally
        {
            _exclusive.Release();
        }
    }

    /// <summary>Closes the port (it is reopened by the next command).</summary>
    public void Close()
    {
        _exclusive.Wait();
        try
        {
            CloseLocked();
        }
        finally
        {
            _exclusive.Release();
        }
    }

    /// <summary>Closes the port for good.</summary>
    public void Dispose()
    {
        _exclusive.Wait();
        try
        {
            CloseLocked();
            _disposed = true;
        }
        finally
        {
            _exclusive.Release();
        }
    }

    private async Task<T> ExchangeAsync<T>(string command, Func<string, ReplyParse<T>> parse, int attempts, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(command);
        ArgumentNullException.ThrowIfNull(parse);
        await _exclusive.WaitAsync(cancellationToken).ConfigureAwait(false);
        try
        {
            for (var attempt = 1; ; attempt++)
            {
                cancellationToken.ThrowIfCancellationRequested();
                try
                {
                    return await Task.Run(() => ExchangeOnce(command, parse), cancellationToken).ConfigureAwait(false);
                }
                catch (InstrumentFaultException fault) when (attempt < attempts && Retryable(fault))
                {
                    SerialLog.Retrying(_logger, Name, _port.Name, attempt, attempts, command, fault.Message);
                }
                catch (InstrumentFaultException fault) when (attempt > 1 && fault.Kind != InstrumentFaultKind.InstrumentError)
                {
                    throw new InstrumentFaultException(Instrument, fault.Kind, $"{Detail(fault)} ({attempt} attempts)", fault);
                }
            }
        }
        finally
        {
            _exclusive.Release();
        }
    }

    // An instrument error is the instrument's considered answer, and a port whose device node is gone will not be
    // back within milliseconds: repeating either only delays the message.
    private bool Retryable(InstrumentFaultException fault)
        => fault.Kind != InstrumentFaultKind.InstrumentError && (fault.Kind != InstrumentFaultKind.PortLost || PortStillThere());

    private string Detail(InstrumentFaultException fault)
        => fault.Message.StartsWith(Instrument + ": ", StringComparison.Ordinal) ? fault.Message[(Instrument.Length + 2)..] : fault.Message;

    private T ExchangeOnce<T>(string command, Func<string, ReplyParse<T>> parse)
    {
        var port = Write(command);
        LineRead read;
        try
        {
            read = LineReader.Read(port, _clock, _port.TimeoutMs, _maxLineLength);
        }
        catch (Exception ex) when (ex is IOException or InvalidOperationException or UnauthorizedAccessException)
        {
            throw Lost(command, ex);
        }

        if (read.IsSilence)
        {
            if (!PortStillThere())
            {
                throw Lost(command, new IOException("the port disappeared"));
            }

            throw Fault(command, InstrumentFaultKind.NoAnswer, $"no answer within {_port.TimeoutMs} ms to '{command}'", "check that it is switched on, its cable, and its baud rate");
        }

        if (read.Problem is { } problem)
        {
            throw Fault(command, InstrumentFaultKind.GarbageReply, $"{problem} to '{command}'", "check the baud rate and the cable");
        }

        var line = read.Line!;
        var frame = _framing.Decode(line);
        if (!frame.IsOk)
        {
            throw Fault(command, InstrumentFaultKind.GarbageReply, $"{frame.Garbage} (reply to '{command}')", "check the cable and for electrical noise");
        }

        var parsed = parse(frame.Value!);
        if (parsed.InstrumentError is { } error)
        {
            SerialLog.Exchange(_logger, Name, _port.Name, command, line);
            throw new InstrumentFaultException(Instrument, InstrumentFaultKind.InstrumentError, $"reported '{error}' to '{command}'");
        }

        if (parsed.Garbage is { } garbage)
        {
            throw Fault(command, InstrumentFaultKind.GarbageReply, $"reply '{line}' to '{command}' not understood: {garbage}", "check that the right instrument is on this port");
        }

        SerialLog.Exchange(_logger, Name, _port.Name, command, line);
        return parsed.Value!;
    }

    private void Send(string command)
    {
        _ = Write(command);
        SerialLog.Sent(_logger, Name, _port.Name, command);
    }

    private SerialPort Write(string command)
    {
        var port = EnsureOpen(command);
        try
        {
            port.DiscardInBuffer();
            var bytes = Encoding.ASCII.GetBytes(_framing.Encode(command) + "\n");
            port.Write(bytes, 0, bytes.Length);
            return port;
        }
        catch (TimeoutException ex)
        {
            throw Lost(command, ex);
        }
        catch (Exception ex) when (ex is IOException or InvalidOperationException or UnauthorizedAccessException)
        {
            throw Lost(command, ex);
        }
    }

    private SerialPort EnsureOpen(string command)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (_serial is { IsOpen: true } open)
        {
            return open;
        }

        CloseLocked();
        if (!PortStillThere())
        {
            throw new InstrumentFaultException(Instrument, InstrumentFaultKind.PortLost,
                $"port {_port.Name} does not exist (sending '{command}'): check that the adapter is plugged in and the fixture names the right port");
        }

        var serial = new SerialPort(_port.Name, _port.Baud, Parity.None, 8, StopBits.One)
        {
            Handshake = Handshake.None,
            ReadTimeout = _port.TimeoutMs,
            // Always bounded: an unbounded write on a dead port can hang for ever.
            WriteTimeout = _port.TimeoutMs,
            Encoding = Encoding.ASCII,
            NewLine = "\n",
        };
        try
        {
            serial.Open();
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or InvalidOperationException or ArgumentException)
        {
            serial.Dispose();
            throw new InstrumentFaultException(Instrument, InstrumentFaultKind.PortLost,
                $"port {_port.Name} could not be opened (sending '{command}'): {ex.Message}; check that no other program holds it and that this user may open it", ex);
        }

        _serial = serial;
        Interlocked.Increment(ref _opened);
        SerialLog.Opened(_logger, Name, _port.Name, _port.Baud);
        return serial;
    }

    // Device names are files on Unix; a vanished node means the adapter (or simulated port) is gone.
    // Names like COM3 cannot be checked this way, so they count as present.
    private bool PortStillThere() => !_port.Name.StartsWith('/') || File.Exists(_port.Name);

    private InstrumentFaultException Fault(string command, InstrumentFaultKind kind, string message, string advice)
    {
        SerialLog.ExchangeFailed(_logger, Name, _port.Name, command, message);
        return new InstrumentFaultException(Instrument, kind, $"{message}: {advice}");
    }

    private InstrumentFaultException Lost(string command, Exception ex)
    {
        SerialLog.Lost(_logger, Name, _port.Name, ex.Message);
        CloseLocked();
        return new InstrumentFaultException(Instrument, InstrumentFaultKind.PortLost,
            $"port {_port.Name} was lost during '{command}' ({ex.Message}): check the cable and the adapter; the port is reopened on the next command", ex);
    }

    private void CloseLocked()
    {
        var serial = _serial;
        _serial = null;
        if (serial is null)
        {
            return;
        }

        try
        {
            serial.Dispose();
        }
        catch (Exception ex) when (ex is IOException or InvalidOperationException or UnauthorizedAccessException)
        {
            // A port that vanished may fail to close cleanly; it is gone either way.
        }

        SerialLog.Closed(_logger, Name, _port.Name);
    }
}
