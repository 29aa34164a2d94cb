using LineTest.Core.Characterisation;

namespace LineTest.Runtime.Batches;

/// <summary>A unit's fitted I–V sweep, kept so a later sweep at another setpoint can give the temperature coefficient.</summary>
/// <param name="Step">The sweep step's name.</param>
/// <param name="Setpoint">The setpoint it ran at.</param>
/// <param name="Celsius">Mean reference temperature during the sweep, °C.</param>
/// <param name="Fit">The fitted junction.</param>
internal sealed record IvSweepRecord(string Step, string Setpoint, double Celsius, ShockleyFitResult Fit);
