namespace LineTest.Core.Results;

/// <summary>What happened at one setpoint of a run: how long the source took to become stable, the soak, and the reference.</summary>
/// <param name="Name">Setpoint name from the sequence.</param>
/// <param name="TargetC">Requested temperature, °C.</param>
/// <param name="ReferenceC">Mean reference temperature while measuring, °C (null when never stable).</param>
/// <param name="SecondsToStable">Seconds from the setpoint command until the source was stable.</param>
/// <param name="SoakSeconds">Seconds the units soaked after the source was stable.</param>
/// <param name="StableAt">When the source was declared stable (UTC), null if it never was.</param>
public sealed record SetpointRecord(
    string Name,
    double TargetC,
    double? ReferenceC,
    double SecondsToStable,
    double SoakSeconds,
    DateTimeOffset? StableAt);
