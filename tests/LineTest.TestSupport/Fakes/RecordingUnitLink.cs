using System.Collections.Concurrent;
using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>
/// A well-behaved unit link: it answers with a fixed identity, keeps working and stored registers in memory, reads
/// raw values and temperatures from functions, and records every command so a test can check what was sent.
/// </summary>
public sealed class RecordingUnitLink : IUnitLink
{
    private readonly Lock _lock = new();
    private readonly Dictionary<string, long> _working;
    private readonly Dictionary<string, long> _stored;
    private readonly ConcurrentQueue<string> _commands = new();

    /// <summary>Creates a link to a unit with the given identity and initial registers.</summary>
    public RecordingUnitLink(UnitIdentity identity, IReadOnlyDictionary<string, long> registers)
    {
        ArgumentNullException.ThrowIfNull(identity);
        ArgumentNullException.ThrowIfNull(registers);
        Identity = identity;
        _working = new Dictionary<string, long>(registers, StringComparer.Ordinal);
        _stored = new Dictionary<string, long>(registers, StringComparer.Ordinal);
    }

    /// <summary>What the unit says when identified.</summary>
    public UnitIdentity Identity { get; }

    /// <summary>Raw reading the unit returns; 0 unless set.</summary>
    public Func<long> Raw { get; set; } = () => 0;

    /// <summary>Temperature the unit returns, °C; 0 unless set.</summary>
    public Func<double> Temperature { get; set; } = () => 0;

    /// <summary>Commands received, in order: identify, raw, temperature, write NAME=CODE…, store, readback.</summary>
    public IReadOnlyList<string> Commands => [.. _commands];

    /// <summary>The working registers now.</summary>
    public IReadOnlyDictionary<string, long> Working
    {
        get
        {
            lock (_lock)
            {
                return new Dictionary<string, long>(_working, StringComparer.Ordinal);
            }
        }
    }

    /// <inheritdoc/>
    public Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken)
    {
        _commands.Enqueue("identify");
        return Task.FromResult(Identity);
    }

    /// <inheritdoc/>
    public Task<long> ReadRawAsync(CancellationToken cancellationToken)
    {
        _commands.Enqueue("raw");
        return Task.FromResult(Raw());
    }

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
    {
        _commands.Enqueue("temperature");
        return Task.FromResult(Temperature());
    }

    /// <inheritdoc/>
    public Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(values);
        _commands.Enqueue("write " + string.Join(' ', values.OrderBy(v => v.Key, StringComparer.Ordinal).Select(v => $"{v.Key}={v.Value}")));
        lock (_lock)
        {
            var unknown = values.Keys.FirstOrDefault(name => !_working.ContainsKey(name));
            if (unknown is not null)
            {
                return Task.FromException(new InstrumentFaultException("unit", InstrumentFaultKind.InstrumentError, $"unknown register '{unknown}'"));
            }

            foreach (var (name, code) in values)
            {
                _working[name] = code;
            }
        }

        return Task.CompletedTask;
    }

    /// <inheritdoc/>
    public Task StoreAsync(CancellationToken cancellationToken)
    {
        _commands.Enqueue("store");
        lock (_lock)
        {
            foreach (var (name, code) in _working)
            {
                _stored[name] = code;
            }
        }

        return Task.CompletedTask;
    }

    /// <inheritdoc/>
    public Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken)
    {
        _commands.Enqueue("readback");
        lock (_lock)
        {
            return Task.FromResult<IReadOnlyDictionary<string, long>>(new Dictionary<string, long>(_stored, StringComparer.Ordinal));
        }
    }
}
