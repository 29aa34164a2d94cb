namespace LineTest.Core.Throughput;

/// <summary>The thermal lower bound of a batch.</summary>
/// <param name="Legs">One leg per setpoint visit.</param>
/// <param name="BatchSeconds">The bound on the batch time.</param>
/// <param name="Units">Units in the batch.</param>
public sealed record ThermalBoundResult(IReadOnlyList<ThermalBoundLeg> Legs, double BatchSeconds, int Units)
{
    /// <summary>Units per hour at the bound (excluding loading).</summary>
    public double UnitsPerHour => BatchSeconds > 0 ? Units * 3600.0 / BatchSeconds : 0;
}
