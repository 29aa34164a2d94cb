using System.Collections.Concurrent;
using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>
/// A voltmeter that answers from a script: queued values per channel first, then the channel's function, and a
/// channel with neither ends in <see cref="InstrumentFaultKind.InstrumentError"/>. Records every read.
/// </summary>
public sealed class ScriptedMeter : IVoltmeter
{
    private readonly ConcurrentDictionary<int, ConcurrentQueue<double>> _queued = new();
    private readonly ConcurrentDictionary<int, Func<double>> _functions = new();
    private readonly ConcurrentQueue<int> _reads = new();

    /// <summary>The channels read, in order.</summary>
    public IReadOnlyList<int> Reads => [.. _reads];

    /// <summary>Queues values that <paramref name="channel"/> returns one by one before its function is used.</summary>
    public ScriptedMeter Then(int channel, params double[] volts)
    {
        var queue = _queued.GetOrAdd(channel, _ => new ConcurrentQueue<double>());
        foreach (var v in volts)
        {
            queue.Enqueue(v);
        }

        return this;
    }

    /// <summary>Makes <paramref name="channel"/> read <paramref name="volts"/> whenever its queue is empty.</summary>
    public ScriptedMeter Always(int channel, Func<double> volts)
    {
        ArgumentNullException.ThrowIfNull(volts);
        _functions[channel] = volts;
        return this;
    }

    /// <summary>Makes <paramref name="channel"/> read a constant whenever its queue is empty.</summary>
    public ScriptedMeter Always(int channel, double volts) => Always(channel, () => volts);

    /// <inheritdoc/>
    public Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken)
    {
        if (cancellationToken.IsCancellationRequested)
        {
            return Task.FromCanceled<double>(cancellationToken);
        }

        _reads.Enqueue(channel);
        if (_queued.TryGetValue(channel, out var queue) && queue.TryDequeue(out var next))
        {
            return Task.FromResult(next);
        }

        return _functions.TryGetValue(channel, out var function)
            ? Task.FromResult(function())
            : Task.FromException<double>(new InstrumentFaultException("meter", InstrumentFaultKind.InstrumentError, $"script has no value for channel {channel}"));
    }
}
