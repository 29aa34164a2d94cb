namespace LineTest.Rig.Instruments;

/// <summary>
/// A source-measure unit (SMU) with a channel scanner: forces a current through one slot's sensor and measures the
/// voltage across it, with a voltage compliance limit that protects an open or high-resistance sensor.
/// </summary>
public interface ISourceMeter
{
    /// <summary>
    /// Routes to <paramref name="channel"/>, sets the source to <paramref name="amps"/> with a voltage compliance of
    /// <paramref name="complianceVolts"/>, and turns the output on.
    /// </summary>
    Task SetCurrentAsync(int channel, double amps, double complianceVolts, CancellationToken cancellationToken);

    /// <summary>Measures the voltage across the routed channel while the current flows.</summary>
    Task<SourceMeterReading> MeasureVoltsAsync(CancellationToken cancellationToken);

    /// <summary>Turns the output off (no current flows).</summary>
    Task OutputOffAsync(CancellationToken cancellationToken);
}
