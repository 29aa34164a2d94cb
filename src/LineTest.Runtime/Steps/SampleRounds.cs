using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Reads the reference and then every unit's output, round after round, so each unit's samples pair with reference
/// samples taken moments before. A unit whose link fails ends in error at once and is left out of the result. Each
/// sample keeps the time it was read, so that a predictive settle can move it to its final value
/// (<see cref="PredictiveApproach"/>).
/// </summary>
internal static class SampleRounds
{
    public static async Task<(double[] References, DateTimeOffset[] ReferenceTimes, List<(UnitContext Unit, double[] Values, DateTimeOffset[] Times)> Outputs)> TakeAsync(
        StepContext context, IReadOnlyList<UnitContext> units, UnitRead read, int samples, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var references = new double[samples];
        var referenceTimes = new DateTimeOffset[samples];
        var outputs = units.Select(u => (Unit: u, Values: new double[samples], Times: new DateTimeOffset[samples])).ToList();
        for (var i = 0; i < samples; i++)
        {
            references[i] = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
            referenceTimes[i] = instruments.Now;
            foreach (var (unit, values, times) in outputs.ToList())
            {
                try
                {
                    values[i] = await instruments.ReadUnitAsync(unit.Slot, read, ct).ConfigureAwait(false);
                    times[i] = instruments.Now;
                }
                catch (UnitFaultException ex)
                {
                    outputs.RemoveAll(o => o.Unit == unit);
                    await context.FaultUnitAsync(unit, ex.Message).ConfigureAwait(false);
                }
            }
        }

        return (references, referenceTimes, outputs);
    }

    /// <summary>
    /// In predictive mode (the setpoint's approach was taken): the reference samples moved to the reference's
    /// extrapolated final value along its fitted approach; otherwise the samples as read.
    /// </summary>
    public static double[] ReferencesAtFinal(PredictiveApproach? approach, double[] references, DateTimeOffset[] times) =>
        approach is null ? references : references.Select((r, i) => r + approach.ReferenceShiftC(times[i])).ToArray();

    /// <summary>
    /// In predictive mode: a unit's samples of <paramref name="read"/> moved to the unit's extrapolated final value along
    /// its fitted approach; otherwise the samples as read.
    /// </summary>
    public static double[] OutputsAtFinal(
        StepContext context, PredictiveApproach? approach, UnitContext unit, UnitRead read, double[] values, DateTimeOffset[] times)
    {
        if (approach?.TrackerOf(unit) is null)
        {
            return values;
        }

        var perUnitScale = ShiftPerUnitScale(context, approach, unit, read);
        return values.Select((v, i) => v + (perUnitScale * approach.UnitShiftC(unit, times[i]))).ToArray();
    }

    /// <summary>
    /// How much of <paramref name="read"/>'s quantity one °C of the unit's own scale (the fit's) makes: the tracked
    /// quantity's own sensitivity when <paramref name="read"/> is it (the fit's scale is that quantity over it), else
    /// the quantity per °C over the unit's scale per °C of the well (<see cref="PredictiveApproach.ScaleOf"/>).
    /// </summary>
    public static double ShiftPerUnitScale(StepContext context, PredictiveApproach approach, UnitContext unit, UnitRead read)
    {
        return read == approach.Tracked
            ? approach.OutputPerC
            : (SoakRunner.QuantityPerC(context.Sequence, read) ?? 0) / approach.ScaleOf(unit);
    }
}
