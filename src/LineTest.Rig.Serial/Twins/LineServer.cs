using System.Text;
using LineTest.Rig.Serial.Logging;
using LineTest.Rig.Serial.Pty;
using LineTest.Rig.Serial.Transport;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// Serves a line protocol on the master end of a pseudo-terminal, on its own background thread: each framed command
/// line is handed to a handler whose <see cref="TwinReply"/> is written back at once. The port is named by a
/// symbolic link, so <see cref="Unplug"/> and <see cref="Replug"/> can make it vanish and return under the same name.
/// </summary>
/// <remarks>
/// The handler runs on the server thread and must answer at once: it may read a simulated instrument (which computes
/// from the virtual clock) but must never wait on that clock. A line whose frame is invalid is ignored, as a real
/// instrument ignores a corrupted command. Dispose every serial port on the link before disposing of the server.
/// </remarks>
public sealed class LineServer : IDisposable
{
    // poll() returns as soon as bytes arrive; the slice only bounds how long Dispose and Unplug wait.
    private const int PollSliceMs = 200;

    private const int PausedMs = 5;

    private readonly string _name;
    private readonly ILineFraming _framing;
    private readonly Func<string, TwinReply> _handler;
    private readonly ILogger _logger;
    private readonly Thread _thread;

    // Concurrency: _pty and _received are guarded by _gate; _stop is volatile.
    private readonly Lock _gate = new();
    private readonly List<string> _received = [];
    private readonly List<string> _receivedLines = [];
    private PseudoTerminal? _pty;
    private volatile bool _stop;

    /// <summary>Opens the port at <paramref name="linkPath"/> and starts serving.</summary>
    /// <param name="name">Instrument name for the log.</param>
    /// <param name="linkPath">Path of the symbolic link that names the port.</param>
    /// <param name="framing">The protocol's framing.</param>
    /// <param name="handler">Answers one command body.</param>
    /// <param name="logger">Commands are logged at Debug.</param>
    public LineServer(string name, string linkPath, ILineFraming framing, Func<string, TwinReply> handler, ILogger logger)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentException.ThrowIfNullOrWhiteSpace(linkPath);
        ArgumentNullException.ThrowIfNull(framing);
        ArgumentNullException.ThrowIfNull(handler);
        ArgumentNullException.ThrowIfNull(logger);
        _name = name;
        PortName = linkPath;
        _framing = framing;
        _handler = handler;
        _logger = logger;
        _pty = PseudoTerminal.Open(linkPath);
        _thread = new Thread(Serve) { IsBackground = true, Name = $"twin {name}" };
        _thread.Start();
    }

    /// <summary>The port name a driver opens.</summary>
    public string PortName { get; }

    /// <summary>True while the port exists.</summary>
    public bool IsPlugged
    {
        get
        {
            lock (_gate)
            {
                return _pty is not null;
            }
        }
    }

    /// <summary>Every command body received so far, in order.</summary>
    public IReadOnlyList<string> Received
    {
        get
        {
            lock (_gate)
            {
                return [.. _received];
            }
        }
    }

    /// <summary>Every line received so far exactly as it came (frame included, line end removed), in order.</summary>
    public IReadOnlyList<string> ReceivedLines
    {
        get
        {
            lock (_gate)
            {
                return [.. _receivedLines];
            }
        }
    }

    /// <summary>The port disappears: the master end is closed and the link removed.</summary>
    public void Unplug()
    {
        lock (_gate)
        {
            _pty?.Dispose();
            _pty = null;
        }
    }

    /// <summary>The port returns under the same name (a new pseudo-terminal behind the same link).</summary>
    public void Replug()
    {
        lock (_gate)
        {
            _pty ??= PseudoTerminal.Open(PortName);
        }
    }

    /// <summary>Stops serving and removes the port.</summary>
    public void Dispose()
    {
        _stop = true;
        _thread.Join();
        Unplug();
    }

    private void Serve()
    {
        var pending = new List<byte>();
        var buffer = new byte[512];
        while (!_stop)
        {
            PseudoTerminal? pty;
            lock (_gate)
            {
                pty = _pty;
            }

            if (pty is null)
            {
                // Unplugged: wait briefly for a replug, which a test or a driver's reopen may be waiting on.
                pending.Clear();
                Thread.Sleep(PausedMs);
                continue;
            }

            try
            {
                if (!pty.WaitReadable(PollSliceMs))
                {
                    continue;
                }

                int count;
                lock (_gate)
                {
                    if (!ReferenceEquals(pty, _pty))
                    {
                        continue;
                    }

                    count = pty.Master.Read(buffer, 0, buffer.Length);
                }

                for (var i = 0; i < count; i++)
                {
                    if (buffer[i] != (byte)'\n')
                    {
                        pending.Add(buffer[i]);
                        continue;
                    }

                    var line = Encoding.ASCII.GetString(pending.ToArray()).TrimEnd('\r');
                    pending.Clear();
                    Answer(pty, line);
                }
            }
            catch (Exception ex) when (ex is IOException or ObjectDisposedException)
            {
                // The slave side closed (EIO) or the port was unplugged meanwhile: wait for the next opener.
                pending.Clear();
                Thread.Sleep(PausedMs);
            }
        }
    }

    private void Answer(PseudoTerminal pty, string line)
    {
        lock (_gate)
        {
            _receivedLines.Add(line);
        }

        var frame = _framing.Decode(line);
        if (!frame.IsOk)
        {
            SerialLog.TwinCommand(_logger, _name, PortName, line, "ignored: " + frame.Garbage);
            return;
        }

        var body = frame.Value!;
        lock (_gate)
        {
            _received.Add(body);
        }

        TwinReply reply;
        try
        {
            reply = _handler(body);
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            // A twin that throws is a bug in the twin; stay silent (the driver reports no answer) and say why in the log.
            SerialLog.TwinFailed(_logger, _name, PortName, ex.Message);
            return;
        }

        if (reply.HangUp)
        {
            SerialLog.TwinCommand(_logger, _name, PortName, body, "port unplugged");
            Unplug();
            return;
        }

        byte[]? bytes = reply.Line is { } text
            ? Encoding.ASCII.GetBytes(_framing.Encode(text) + "\n")
            : reply.Junk is { } junk ? [.. junk] : null;
        SerialLog.TwinCommand(_logger, _name, PortName, body, reply.Line is { } t ? $"answered '{t}'" : bytes is null ? "silent" : "sent junk");
        if (bytes is null)
        {
            return;
        }

        lock (_gate)
        {
            if (ReferenceEquals(pty, _pty))
            {
                pty.Master.Write(bytes, 0, bytes.Length);
            }
        }
    }
}
