using LineTest.Core.Results;
using LineTest.Core.Throughput;

namespace LineTest.Station.Demo;

/// <summary>
/// What a dry run predicts: the timeline, the batch time and the thermal bound of the sequence's own settle modes
/// (<see cref="Bound"/>), beside the bound of waiting for stability everywhere (<see cref="WindowBound"/>; the same
/// when the sequence is in window mode).
/// </summary>
public sealed record DryRunReport(
    IReadOnlyList<DryRunPhase> Setpoints,
    double BatchSeconds,
    int Units,
    ThermalBoundResult Bound,
    ThermalBoundResult WindowBound,
    IReadOnlyList<RunRecord> Runs,
    string? Aborted)
{
    /// <summary>Units per hour of the simulated schedule (loading excluded).</summary>
    public double UnitsPerHour => BatchSeconds > 0 ? Units * 3600.0 / BatchSeconds : 0;
}
