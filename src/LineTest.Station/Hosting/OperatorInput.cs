using System.Text;
using System.Threading.Channels;

namespace LineTest.Station.Hosting;

/// <summary>
/// What the operator does, in order: lines from the keyboard (and a keyboard-wedge scanner, which types the serial and
/// Enter) and, when the fixture has one, codes from the serial scanner (<see cref="Post"/>). On a terminal, keys are
/// read one by one so the screen can show what is being typed; otherwise whole lines are read from standard input.
/// End of keyboard input completes the channel.
/// </summary>
public sealed class OperatorInput : IDisposable
{
    private readonly Channel<OperatorEntry> _lines = Channel.CreateUnbounded<OperatorEntry>(new UnboundedChannelOptions { SingleReader = true });
    private readonly StringBuilder _buffer = new();
    private readonly Lock _gate = new();
    private readonly CancellationTokenSource _stop = new();

    private OperatorInput()
    {
    }

    /// <summary>What has been typed on the current line so far.</summary>
    public string Buffer
    {
        get
        {
            lock (_gate)
            {
                return _buffer.ToString();
            }
        }
    }

    /// <summary>Starts reading keys from the console (interactive terminal).</summary>
    public static OperatorInput FromConsoleKeys()
    {
        var input = new OperatorInput();
        var thread = new Thread(input.ReadKeys) { IsBackground = true, Name = "operator keys" };
        thread.Start();
        return input;
    }

    /// <summary>Starts reading whole lines from <paramref name="reader"/>.</summary>
    public static OperatorInput FromLines(TextReader reader)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var input = new OperatorInput();
        _ = Task.Run(async () =>
        {
            try
            {
                while (await reader.ReadLineAsync(input._stop.Token).ConfigureAwait(false) is { } line)
                {
                    await input._lines.Writer.WriteAsync(OperatorEntry.Typed(line), input._stop.Token).ConfigureAwait(false);
                }
            }
            catch (OperationCanceledException)
            {
            }
            finally
            {
                input._lines.Writer.TryComplete();
            }
        });
        return input;
    }

    /// <summary>Adds an entry from another source (the serial scanner); false once keyboard input has ended.</summary>
    public bool Post(OperatorEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        return _lines.Writer.TryWrite(entry);
    }

    /// <summary>The next entry, or null at end of keyboard input.</summary>
    public async Task<OperatorEntry?> ReadAsync(CancellationToken cancellationToken)
    {
        try
        {
            return await _lines.Reader.ReadAsync(cancellationToken).ConfigureAwait(false);
        }
        catch (ChannelClosedException)
        {
            return null;
        }
    }

    /// <inheritdoc />
    public void Dispose()
    {
        _stop.Cancel();
        _stop.Dispose();
    }

    private void ReadKeys()
    {
        while (!_stop.IsCancellationRequested)
        {
            ConsoleKeyInfo key;
            try
            {
                key = Console.ReadKey(intercept: true);
            }
            catch (InvalidOperationException)
            {
                _lines.Writer.TryComplete();
                return;
            }

            lock (_gate)
            {
                if (key.Key == ConsoleKey.Enter)
                {
                    _lines.Writer.TryWrite(OperatorEntry.Typed(_buffer.ToString()));
                    _buffer.Clear();
                }
                else if (key.Key == ConsoleKey.Backspace && _buffer.Length > 0)
                {
                    _buffer.Length--;
                }
                else if (!char.IsControl(key.KeyChar))
                {
                    _buffer.Append(key.KeyChar);
                }
            }
        }
    }
}
