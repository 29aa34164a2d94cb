using System.Collections.Concurrent;
using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>
/// A temperature source that reaches every setpoint at once unless told otherwise: its temperature is
/// <see cref="Temperature"/> applied to the current setpoint. Records setpoints and standby requests.
/// </summary>
public sealed class ScriptedSource : ITemperatureSource
{
    private readonly ConcurrentQueue<double> _setpoints = new();
    private double _setpointC;
    private int _standbyRequests;

    /// <summary>Creates a source at <paramref name="initialC"/>.</summary>
    public ScriptedSource(double initialC = 23) => Volatile.Write(ref _setpointC, initialC);

    /// <summary>The source's temperature as a function of its setpoint; by default it sits exactly on the setpoint.</summary>
    public Func<double, double> Temperature { get; set; } = setpoint => setpoint;

    /// <summary>A fault text the status reports, or null.</summary>
    public string? Fault { get; set; }

    /// <summary>Setpoints commanded, in order (standby included).</summary>
    public IReadOnlyList<double> Setpoints => [.. _setpoints];

    /// <summary>How many times standby was requested.</summary>
    public int StandbyRequests => Volatile.Read(ref _standbyRequests);

    /// <summary>Standby temperature, °C.</summary>
    public double StandbyC { get; init; } = 23;

    /// <inheritdoc/>
    public Task SetSetpointAsync(double celsius, CancellationToken cancellationToken)
    {
        _setpoints.Enqueue(celsius);
        Volatile.Write(ref _setpointC, celsius);
        return Task.CompletedTask;
    }

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => Task.FromResult(Temperature(Volatile.Read(ref _setpointC)));

    /// <inheritdoc/>
    public Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken)
    {
        var setpoint = Volatile.Read(ref _setpointC);
        return Task.FromResult(new SourceStatus(setpoint, Temperature(setpoint), Fault));
    }

    /// <inheritdoc/>
    public Task GoToStandbyAsync(CancellationToken cancellationToken)
    {
        Interlocked.Increment(ref _standbyRequests);
        return SetSetpointAsync(StandbyC, cancellationToken);
    }
}
