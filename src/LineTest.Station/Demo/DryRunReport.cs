using LineTest.Core.Results;
using LineTest.Core.Throughput;

namespace LineTest.Station.Demo;

/// <summary>What a dry run predicts.</summary>
public sealed record DryRunReport(
    IReadOnlyList<DryRunPhase> Setpoints,
    double BatchSeconds,
    int Units,
    ThermalBoundResult Bound,
    IReadOnlyList<RunRecord> Runs,
    string? Aborted)
{
    /// <summary>Units per hour of the simulated schedule (loading excluded).</summary>
    public double UnitsPerHour => BatchSeconds > 0 ? Units * 3600.0 / BatchSeconds : 0;
}
