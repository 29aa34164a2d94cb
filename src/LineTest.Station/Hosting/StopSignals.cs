using System.Runtime.InteropServices;
using System.Threading.Channels;

namespace LineTest.Station.Hosting;

/// <summary>
/// Ctrl-C (SIGINT) and SIGTERM for the whole process. While nobody has claimed them, a signal cancels
/// <see cref="Token"/> (every command stops). The hosted station claims them while it runs so that Ctrl-C during a
/// batch can ask for confirmation first; then each signal is queued for it (<see cref="ReadAsync"/>).
/// </summary>
public sealed class StopSignals : IDisposable
{
    private readonly CancellationTokenSource _stop = new();
    private readonly Channel<PosixSignal> _claimed = Channel.CreateUnbounded<PosixSignal>();
    private readonly List<PosixSignalRegistration> _registrations = [];
    private volatile bool _isClaimed;

    /// <summary>Cancelled by a signal nobody claimed.</summary>
    public CancellationToken Token => _stop.Token;

    /// <summary>The last signal received, if any.</summary>
    public PosixSignal? Last { get; private set; }

    /// <summary>Listens for SIGINT and SIGTERM (their default, ending the process at once, is suppressed).</summary>
    public static StopSignals Register()
    {
        var signals = new StopSignals();
        foreach (var signal in new[] { PosixSignal.SIGINT, PosixSignal.SIGTERM })
        {
            signals._registrations.Add(PosixSignalRegistration.Create(signal, context =>
            {
                context.Cancel = true;
                signals.Raise(context.Signal);
            }));
        }

        return signals;
    }

    /// <summary>From now on signals are queued for <see cref="ReadAsync"/> instead of cancelling <see cref="Token"/>.</summary>
    public void Claim() => _isClaimed = true;

    /// <summary>Delivers <paramref name="signal"/> as if the process had received it.</summary>
    public void Raise(PosixSignal signal)
    {
        Last = signal;
        if (_isClaimed)
        {
            _claimed.Writer.TryWrite(signal);
        }
        else
        {
            _stop.Cancel();
        }
    }

    /// <summary>The next claimed signal.</summary>
    public Task<PosixSignal> ReadAsync(CancellationToken cancellationToken) => _claimed.Reader.ReadAsync(cancellationToken).AsTask();

    /// <inheritdoc />
    public void Dispose()
    {
        foreach (var registration in _registrations)
        {
            registration.Dispose();
        }

        _stop.Dispose();
    }
}
