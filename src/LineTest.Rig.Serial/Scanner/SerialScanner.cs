using System.IO.Ports;
using System.Text;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Scanner;

/// <summary>
/// A scanner on a serial port that sends each code as one line (ended by CR, LF or CR LF). It only listens: it waits as
/// long as it takes for the next line, in slices of the port's timeout so that cancellation is noticed. A line with
/// non-printable bytes, an over-long one or one that gets no line end within the port's timeout of its first byte is a
/// rejected scan (<see cref="ScanListener"/>); a lost port is an <see cref="InstrumentFaultException"/> and the port
/// is reopened on the next call.
/// </summary>
public sealed class SerialScanner : IBarcodeScanner, IDisposable
{
    private const string Name = "scanner";

    private readonly PortDefinition _port;
    private readonly ILogger _logger;
    private readonly TimeProvider _clock;

    private readonly byte[] _chunk = new byte[256];

    // Concurrency: one NextAsync at a time (the station has one scan loop); _serial and _listener are touched only
    // there and in Dispose.
    private ScanListener _listener;
    private SerialPort? _serial;

    /// <summary>Creates the scanner; the port is opened on the first call.</summary>
    public SerialScanner(PortDefinition port, ILogger logger, TimeProvider clock)
    {
        ArgumentNullException.ThrowIfNull(port);
        ArgumentNullException.ThrowIfNull(logger);
        ArgumentNullException.ThrowIfNull(clock);
        ArgumentOutOfRangeException.ThrowIfLessThan(port.TimeoutMs, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(port.Baud, 1);
        _port = port;
        _logger = logger;
        _clock = clock;
        _listener = new ScanListener(port.TimeoutMs, clock);
    }

    /// <summary>The port the scanner is on.</summary>
    public PortDefinition Port => _port;

    /// <inheritdoc/>
    public Task<ScanResult> NextAsync(CancellationToken cancellationToken) => Task.Run(() => Next(cancellationToken), cancellationToken);

    /// <summary>Closes the port.</summary>
    public void Dispose()
    {
        _serial?.Dispose();
        _serial = null;
    }

    // A lost port: whatever part of a code had arrived is gone with it.
    private void Lose()
    {
        Dispose();
        _listener = new ScanListener(_port.TimeoutMs, _clock);
    }

    private ScanResult Next(CancellationToken cancellationToken)
    {
        while (true)
        {
            if (_listener.TryTake(out var result))
            {
                if (result.Serial is { } serial)
                {
                    SerialLog.Scanned(_logger, _port.Name, serial);
                }
                else
                {
                    SerialLog.ScanRejected(_logger, _port.Name, result.Problem!);
                }

                return result;
            }

            cancellationToken.ThrowIfCancellationRequested();
            var port = Open();
            int count;
            try
            {
                port.ReadTimeout = _listener.WaitMs(_clock.GetTimestamp(), _port.TimeoutMs);
                count = port.Read(_chunk, 0, _chunk.Length);
            }
            catch (TimeoutException)
            {
                count = 0;
            }
            catch (Exception ex) when (ex is IOException or InvalidOperationException or UnauthorizedAccessException)
            {
                Lose();
                throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                    $"port {_port.Name} was lost ({ex.Message}): check the scanner's cable; the port is reopened on the next scan", ex);
            }

            var now = _clock.GetTimestamp();
            _listener.Receive(_chunk.AsSpan(0, count), now);
            _listener.Expire(now);
            if (count == 0 && _port.Name.StartsWith('/') && !File.Exists(_port.Name))
            {
                Lose();
                throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                    $"port {_port.Name} disappeared: check the scanner's cable; the port is reopened on the next scan");
            }
        }
    }

    private SerialPort Open()
    {
        if (_serial is { IsOpen: true } open)
        {
            return open;
        }

        Dispose();
        if (_port.Name.StartsWith('/') && !File.Exists(_port.Name))
        {
            throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                $"port {_port.Name} does not exist: check that the scanner is plugged in and the station names the right port");
        }

        var serial = new SerialPort(_port.Name, _port.Baud, Parity.None, 8, StopBits.One)
        {
            ReadTimeout = _port.TimeoutMs,
            WriteTimeout = _port.TimeoutMs,
            Encoding = Encoding.ASCII,
        };
        try
        {
            serial.Open();
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or InvalidOperationException or ArgumentException)
        {
            serial.Dispose();
            throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                $"port {_port.Name} could not be opened: {ex.Message}", ex);
        }

        _serial = serial;
        return serial;
    }
}
