namespace LineTest.Station.Demo;

/// <summary>
/// One stage of <see cref="AccuracyDecomposition"/>: the true error a gain-and-offset trim would leave with the error
/// sources up to and including this one, over units and rated-range temperatures, and what this source adds.
/// </summary>
/// <param name="Name">The error source this stage adds.</param>
/// <param name="MaxAbsErrorC">Largest |error| with every source up to this one, °C.</param>
/// <param name="RmsErrorC">RMS error with every source up to this one, °C.</param>
/// <param name="StepMaxAbsC">Largest |change| this source makes to a unit's error at a temperature, °C.</param>
/// <param name="StepRmsC">RMS of that change, °C.</param>
public sealed record AccuracyStage(string Name, double MaxAbsErrorC, double RmsErrorC, double StepMaxAbsC, double StepRmsC);
