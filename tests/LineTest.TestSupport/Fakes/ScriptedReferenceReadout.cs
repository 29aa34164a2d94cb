using System.Collections.Concurrent;
using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A reference readout that answers queued raw values first, then <see cref="Raw"/>.</summary>
public sealed class ScriptedReferenceReadout : IReferenceReadout
{
    private readonly ConcurrentQueue<double> _queued = new();

    /// <summary>Creates a readout that reads <paramref name="raw"/> when nothing is queued.</summary>
    public ScriptedReferenceReadout(Func<double> raw)
    {
        ArgumentNullException.ThrowIfNull(raw);
        Raw = raw;
    }

    /// <summary>Creates a readout that reads a constant when nothing is queued.</summary>
    public ScriptedReferenceReadout(double raw)
        : this(() => raw)
    {
    }

    /// <summary>The raw value once the queue is empty.</summary>
    public Func<double> Raw { get; set; }

    /// <summary>Queues values returned one by one.</summary>
    public ScriptedReferenceReadout Then(params double[] raw)
    {
        foreach (var value in raw)
        {
            _queued.Enqueue(value);
        }

        return this;
    }

    /// <inheritdoc/>
    public Task<double> ReadRawAsync(CancellationToken cancellationToken)
        => Task.FromResult(_queued.TryDequeue(out var next) ? next : Raw());
}
