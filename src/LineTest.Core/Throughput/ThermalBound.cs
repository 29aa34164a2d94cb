using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Sequences.Steps;
using LineTest.Core.Stability;

namespace LineTest.Core.Throughput;

/// <summary>
/// The thermal lower bound of a batch: the shortest time in which the sequence's setpoints could be visited and
/// measured to the stability the sequence asks for, given the fixture's source model (ramp-rate limit, then a
/// first-order approach with time constant τ), the stability window, the units' soak window and the time the
/// steps at each setpoint themselves take (each kind's <see cref="IStepKind.EstimateSeconds"/>: measurements and I–V
/// sweeps). No schedule can beat it; the ratio of it to a simulated batch says how much
/// cycle time is left on the table.
/// </summary>
/// <remarks>
/// At a setpoint whose settle mode is <c>predictive</c> (<see cref="SettleSettings.For"/>) the leg is the predictive
/// one: no band, window or soak to wait for, but the fit needs the readings to cover at least
/// <see cref="PredictiveSettle.MinimumTimeConstantsCovered"/> time constants of the first-order approach, which starts
/// when the ramp ends; so travel is the ramp plus that many τ.
/// </remarks>
public static class ThermalBound
{
    /// <summary>Computes the bound for one batch of <paramref name="units"/> units starting at <paramref name="startC"/>.</summary>
    /// <param name="sequence">The sequence (setpoints in step order).</param>
    /// <param name="source">The fixture's source.</param>
    /// <param name="startC">Block temperature when the batch starts (standby for the first batch).</param>
    /// <param name="units">Units in the batch.</param>
    /// <param name="referenceReadSeconds">One reference reading, seconds.</param>
    /// <param name="meterReadSeconds">One meter reading, seconds.</param>
    public static ThermalBoundResult Compute(
        SequenceDefinition sequence, SourceDefinition source, double startC, int units, double referenceReadSeconds, double meterReadSeconds)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(source);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(units);
        var legs = new List<ThermalBoundLeg>();
        var current = startC;
        SetpointDefinition? settled = null;
        var measureSeconds = 0.0;
        var model = new StepTimeModel(units, referenceReadSeconds, meterReadSeconds);
        foreach (var step in sequence.Steps)
        {
            var kind = StepKinds.Of(step);
            if (kind.PlannerRole == PlannerRole.Settle)
            {
                if (settled is not null)
                {
                    legs.Add(Leg(sequence, source, settled, current, measureSeconds));
                    current = settled.Celsius;
                }

                settled = sequence.Setpoints.First(s => s.Name == kind.SetpointOf(step));
                measureSeconds = 0;
            }
            else
            {
                // Every other step's own least time (measurements, sweeps) counts at the setpoint it runs at.
                measureSeconds += kind.EstimateSeconds(step, model);
            }
        }

        if (settled is not null)
        {
            legs.Add(Leg(sequence, source, settled, current, measureSeconds));
        }

        return new ThermalBoundResult(legs, legs.Sum(l => l.TotalSeconds), units);
    }

    /// <summary>
    /// Time for the first-order source to get from <paramref name="fromC"/> to within <paramref name="bandC"/> of
    /// <paramref name="toC"/>: with rate limit r and time constant τ the source ramps at r until its error is r·τ,
    /// then decays exponentially, so t = (|Δ| − rτ)/r + τ·ln(rτ/band) when |Δ| &gt; rτ, else τ·ln(|Δ|/band).
    /// </summary>
    public static double TravelSeconds(SourceDefinition source, double fromC, double toC, double bandC)
    {
        ArgumentNullException.ThrowIfNull(source);
        var delta = Math.Abs(toC - fromC);
        if (delta <= bandC)
        {
            return 0;
        }

        var (_, knee) = RateAndKnee(source, fromC, toC);
        var tau = source.SettlingTimeConstantSeconds;
        return delta > knee
            ? RampSeconds(source, fromC, toC) + tau * Math.Log(knee / bandC)
            : tau * Math.Log(delta / bandC);
    }

    /// <summary>
    /// Seconds the source ramps at its rate limit from <paramref name="fromC"/> towards <paramref name="toC"/> before
    /// its first-order approach begins (|Δ| − rτ)/r, or 0 when the step is within rτ.
    /// </summary>
    public static double RampSeconds(SourceDefinition source, double fromC, double toC)
    {
        ArgumentNullException.ThrowIfNull(source);
        var delta = Math.Abs(toC - fromC);
        var (ratePerSecond, knee) = RateAndKnee(source, fromC, toC);
        return delta > knee ? (delta - knee) / ratePerSecond : 0;
    }

    /// <summary>The source's rate limit towards <paramref name="toC"/>, °C/s, and its knee rτ, °C.</summary>
    private static (double RatePerSecond, double Knee) RateAndKnee(SourceDefinition source, double fromC, double toC)
    {
        var ratePerSecond = (toC > fromC ? source.RampUpCPerMinute : source.RampDownCPerMinute) / 60.0;
        return (ratePerSecond, ratePerSecond * source.SettlingTimeConstantSeconds);
    }

    private static ThermalBoundLeg Leg(SequenceDefinition sequence, SourceDefinition source, SetpointDefinition setpoint, double fromC, double measureSeconds)
    {
        if (SettleSettings.For(sequence, setpoint.Name).Mode == SettleModes.Predictive)
        {
            var approach = Math.Abs(setpoint.Celsius - fromC) > 0
                ? PredictiveSettle.MinimumTimeConstantsCovered * source.SettlingTimeConstantSeconds
                : 0;
            return new ThermalBoundLeg(setpoint.Name, setpoint.Celsius, RampSeconds(source, fromC, setpoint.Celsius) + approach, 0, 0, measureSeconds);
        }

        var travel = TravelSeconds(source, fromC, setpoint.Celsius, sequence.Stability.BandC);

        // Stability can only be declared after a full window of in-band readings; the units then need at least
        // the sequence's minimum soak and one soak window of readings to show they stopped drifting.
        var stable = sequence.Stability.WindowSeconds;
        var soak = Math.Max(sequence.Soak.MinimumSeconds, 0) + sequence.Soak.WindowSeconds;
        return new ThermalBoundLeg(setpoint.Name, setpoint.Celsius, travel, stable, soak, measureSeconds);
    }
}
