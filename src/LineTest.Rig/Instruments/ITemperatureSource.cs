namespace LineTest.Rig.Instruments;

/// <summary>A dry block, bath or chamber that can be commanded to a setpoint.</summary>
public interface ITemperatureSource
{
    /// <summary>Commands a new setpoint, °C. The caller has already checked it against the fixture's safe range.</summary>
    Task SetSetpointAsync(double celsius, CancellationToken cancellationToken);

    /// <summary>Reads the source's own control sensor, °C.</summary>
    Task<double> ReadTemperatureAsync(CancellationToken cancellationToken);

    /// <summary>Reads the source's status.</summary>
    Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken);

    /// <summary>Sends the source to its standby temperature.</summary>
    Task GoToStandbyAsync(CancellationToken cancellationToken);
}
