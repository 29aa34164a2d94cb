namespace LineTest.Rig.Instruments;

/// <summary>What a temperature source reports about itself.</summary>
/// <param name="SetpointC">The setpoint it is controlling to, °C.</param>
/// <param name="ActualC">Its own control sensor, °C.</param>
/// <param name="Fault">A fault text from the source, or null.</param>
public sealed record SourceStatus(double SetpointC, double ActualC, string? Fault);
