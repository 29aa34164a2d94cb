using LineTest.Rig.Instruments;

namespace LineTest.Station.Campaign;

/// <summary>
/// Sits between the coordinator and the simulated source: remembers the last command the station sent (setpoint or
/// standby, whether or not the source accepted it), and can run an action right after the n-th setpoint command of a
/// batch has been accepted (to break the heater or start a reference drift mid-batch).
/// </summary>
internal sealed class SourceWatch(ITemperatureSource inner) : ITemperatureSource
{
    private int _setpoints;
    private int _armedAt = -1;
    private Action? _armed;

    /// <summary>True when the last command sent was standby.</summary>
    public bool LastCommandWasStandby { get; private set; } = true;

    /// <summary>Starts a new batch: counts setpoints from zero and forgets any armed action.</summary>
    public void NewBatch()
    {
        _setpoints = 0;
        _armed = null;
        _armedAt = -1;
    }

    /// <summary>Runs <paramref name="action"/> right after the <paramref name="setpointNumber"/>-th setpoint (1-based) is accepted.</summary>
    public void After(int setpointNumber, Action action)
    {
        _armedAt = setpointNumber;
        _armed = action;
    }

    public async Task SetSetpointAsync(double celsius, CancellationToken cancellationToken)
    {
        LastCommandWasStandby = false;
        await inner.SetSetpointAsync(celsius, cancellationToken).ConfigureAwait(false);
        _setpoints++;
        if (_setpoints == _armedAt && _armed is { } action)
        {
            _armed = null;
            action();
        }
    }

    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken) => inner.ReadTemperatureAsync(cancellationToken);

    public Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken) => inner.ReadStatusAsync(cancellationToken);

    public Task GoToStandbyAsync(CancellationToken cancellationToken)
    {
        LastCommandWasStandby = true;
        return inner.GoToStandbyAsync(cancellationToken);
    }
}
