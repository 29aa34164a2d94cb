using LineTest.Rig.Instruments;

namespace LineTest.TestSupport.Fakes;

/// <summary>A temperature source that never answers: every command ends in <see cref="InstrumentFaultKind.NoAnswer"/>.</summary>
public sealed class SilentSource : ITemperatureSource
{
    private static InstrumentFaultException Fault(string command)
        => new("source", InstrumentFaultKind.NoAnswer, $"no answer to {command}");

    /// <inheritdoc/>
    public Task SetSetpointAsync(double celsius, CancellationToken cancellationToken) => Task.FromException(Fault("set setpoint"));

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken) => Task.FromException<double>(Fault("read temperature"));

    /// <inheritdoc/>
    public Task<SourceStatus> ReadStatusAsync(CancellationToken cancellationToken) => Task.FromException<SourceStatus>(Fault("read status"));

    /// <inheritdoc/>
    public Task GoToStandbyAsync(CancellationToken cancellationToken) => Task.FromException(Fault("standby"));
}
