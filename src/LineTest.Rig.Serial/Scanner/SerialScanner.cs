using System.IO.Ports;
using System.Text;
using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Logging;
using LineTest.Rig.Serial.Transport;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Scanner;

/// <summary>
/// A scanner on a serial port that sends each code as one line. It only listens: it waits as long as it takes for the
/// next line, in slices of the port's timeout so that cancellation is noticed. A line with non-printable bytes, an
/// over-long one or one without a line end is a rejected scan; a lost port is an
/// <see cref="InstrumentFaultException"/> and the port is reopened on the next call.
/// </summary>
public sealed class SerialScanner : IBarcodeScanner, IDisposable
{
    private const string Name = "scanner";

    private readonly PortDefinition _port;
    private readonly ILogger _logger;
    private readonly TimeProvider _clock;

    // Concurrency: one NextAsync at a time (the station has one scan loop); _serial is touched only there and in Dispose.
    private SerialPort? _serial;

    /// <summary>Creates the scanner; the port is opened on the first call.</summary>
    public SerialScanner(PortDefinition port, ILogger logger, TimeProvider clock)
    {
        ArgumentNullException.ThrowIfNull(port);
        ArgumentNullException.ThrowIfNull(logger);
        ArgumentNullException.ThrowIfNull(clock);
        _port = port;
        _logger = logger;
        _clock = clock;
    }

    /// <inheritdoc/>
    public Task<ScanResult> NextAsync(CancellationToken cancellationToken) => Task.Run(() => Next(cancellationToken), cancellationToken);

    /// <summary>Closes the port.</summary>
    public void Dispose()
    {
        _serial?.Dispose();
        _serial = null;
    }

    private ScanResult Next(CancellationToken cancellationToken)
    {
        while (true)
        {
            cancellationToken.ThrowIfCancellationRequested();
            var port = Open();
            LineRead read;
            try
            {
                read = LineReader.Read(port, _clock, _port.TimeoutMs, SerialText.MaxLength * 2);
            }
            catch (Exception ex) when (ex is IOException or InvalidOperationException or UnauthorizedAccessException)
            {
                Dispose();
                throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                    $"port {_port.Name} was lost ({ex.Message}): check the scanner's cable; the port is reopened on the next scan", ex);
            }

            if (read.IsSilence)
            {
                if (_port.Name.StartsWith('/') && !File.Exists(_port.Name))
                {
                    Dispose();
                    throw new InstrumentFaultException($"{Name} on {_port.Name}", InstrumentFaultKind.PortLost,
                        $"port {_port.Name} disappeared: check the scanner's cable; the port is reopened on the next scan");
                }

                continue;
            }

            var result = read.Line is { } line ? SerialText.Check(line) : ScanResult.Rejected(read.Problem!);
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
