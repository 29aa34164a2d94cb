namespace LineTest.Station.Demo;

/// <summary>
/// Simulated throughput of one sequence on one fixture: the same number of defect-free units tested by the baseline
/// schedule (one unit at a time, fixed waits, file order), by LineTest's fast schedule (every slot, waits judged from
/// readings, free order, checks while ramping), and the thermal lower bound of the fast schedule's batches. Times
/// are batch times only; loading and unloading are left out of all three alike.
/// </summary>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="Units">Units tested by each schedule.</param>
/// <param name="Batches">Batches of the fast schedule.</param>
/// <param name="BaselineSeconds">Sum of the baseline's batch times, simulated seconds.</param>
/// <param name="FastSeconds">Sum of the fast schedule's batch times, simulated seconds.</param>
/// <param name="BoundSeconds">Sum of the thermal bounds of the fast schedule's batches, each from where its block started.</param>
/// <param name="Aborted">Why a batch stopped, if one did (then the figures are not comparable).</param>
/// <param name="WindowBoundSeconds">
/// Sum of the wait-for-stability bounds of the same batches (every setpoint in window mode); equal to
/// <paramref name="BoundSeconds"/> for a sequence in window mode, the old bound a predictive sequence is compared with.
/// </param>
/// <param name="Mode">The sequence's settle mode: <c>window</c>, <c>predictive</c> or <c>mixed</c>.</param>
public sealed record ThroughputFigures(
    string SequenceId, int Units, int Batches, double BaselineSeconds, double FastSeconds, double BoundSeconds, string? Aborted, double WindowBoundSeconds,
    string Mode)
{
    /// <summary>Baseline units per hour.</summary>
    public double BaselineUnitsPerHour => PerHour(BaselineSeconds);

    /// <summary>LineTest (fast schedule) units per hour.</summary>
    public double UnitsPerHour => PerHour(FastSeconds);

    /// <summary>Units per hour at the thermal bound.</summary>
    public double BoundUnitsPerHour => PerHour(BoundSeconds);

    /// <summary>Units per hour at the wait-for-stability bound.</summary>
    public double WindowBoundUnitsPerHour => PerHour(WindowBoundSeconds);

    /// <summary>LineTest's throughput over the wait-for-stability bound's (above 1 only when settling predictively).</summary>
    public double RatioToWindowBound => WindowBoundUnitsPerHour > 0 ? UnitsPerHour / WindowBoundUnitsPerHour : 0;

    /// <summary>LineTest's throughput as a fraction of the bound's.</summary>
    public double RatioToBound => BoundUnitsPerHour > 0 ? UnitsPerHour / BoundUnitsPerHour : 0;

    /// <summary>LineTest's throughput over the baseline's.</summary>
    public double RatioToBaseline => BaselineUnitsPerHour > 0 ? UnitsPerHour / BaselineUnitsPerHour : 0;

    private double PerHour(double seconds) => seconds > 0 ? Units * 3600.0 / seconds : 0;
}
