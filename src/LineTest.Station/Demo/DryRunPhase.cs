namespace LineTest.Station.Demo;

/// <summary>One setpoint of a dry run: when it was commanded, and how long the source took to be stable, the soak and the measurements.</summary>
public sealed record DryRunPhase(string Setpoint, double Celsius, double StartSeconds, double RampAndStableSeconds, double SoakSeconds, double MeasureSeconds);
