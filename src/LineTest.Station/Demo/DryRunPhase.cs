namespace LineTest.Station.Demo;

/// <summary>
/// One setpoint of a dry run: when it was commanded, and how long the source took to be stable (or, in predictive mode,
/// until the readings were taken), the soak and the measurements; how it settled (<c>window</c>, <c>predictive</c> or
/// <c>window-fallback</c>) and, for a fallback, why.
/// </summary>
public sealed record DryRunPhase(
    string Setpoint, double Celsius, double StartSeconds, double RampAndStableSeconds, double SoakSeconds, double MeasureSeconds, string Mode,
    string? FallbackReason);
