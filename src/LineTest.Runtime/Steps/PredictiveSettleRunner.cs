using System.Globalization;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// The predictive settle (<c>"settle": {"mode": "predictive"}</c>): from the setpoint command on, round after round, the
/// reference and every unit's soak quantity are read and fed to a <see cref="PredictiveApproach"/> (and the reference to
/// the stability window, so that a fallback loses nothing). It ends when the approach says take (the readings at this
/// setpoint are then moved to the extrapolated final values, and no soak is needed), or falls back — a disturbance, a
/// predicted value outside the band, a quantity that cannot be moved to its final value, or the window met first.
/// </summary>
internal static class PredictiveSettleRunner
{
    /// <summary>How far back each fit reaches, in time constants of the source: the ramp drops out, the approach stays in.</summary>
    public const double FitSpanTimeConstants = 4;

    /// <summary>Shortest round of readings, seconds: the reference and every unit are read once per round.</summary>
    public const double MinimumRoundSeconds = 2;

    /// <summary>Follows the approach until it is taken or falls back; the source timeout ends it as a fallback.</summary>
    public static async Task<PredictiveApproach> ApproachAsync(
        StepContext context, SetpointDefinition setpoint, SettleSettings settle, DateTimeOffset commanded, StabilityWindow window, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var sequence = context.Sequence;
        var stability = sequence.Stability;
        // Each unit is followed in the quantity its readings at this setpoint are taken in (the verify's reported °C,
        // the measure's volts or counts), so that moving them to their final values needs no conversion; the soak's
        // quantity when the steps read different ones.
        var soakRead = SoakRunner.SoakRead(sequence);
        var reads = ReadsAt(sequence, setpoint.Name).Distinct().ToList();
        var read = reads.Count == 1 && SoakRunner.QuantityPerC(sequence, reads[0]) is not null ? reads[0] : soakRead;
        var perC = SoakRunner.QuantityPerC(sequence, read) ?? SoakRunner.OutputPerC(sequence);
        var approach = new PredictiveApproach(setpoint, settle, stability, FitSpanTimeConstants * instruments.Fixture.Source.SettlingTimeConstantSeconds,
            perC, commanded, read);
        if (Unconvertible(sequence, setpoint.Name) is { } why)
        {
            approach.FallBack(why);
            return approach;
        }

        while (true)
        {
            var roundStart = instruments.Now;
            var celsius = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
            window.Add(approach.Seconds(instruments.Now), celsius);
            approach.AddReference(instruments.Now, celsius);
            context.Observer.SourceChanged(setpoint.Celsius, celsius, "settling");
            foreach (var unit in context.Batch.Active)
            {
                try
                {
                    var output = await instruments.ReadUnitAsync(unit.Slot, read, ct).ConfigureAwait(false);
                    approach.AddUnit(unit, instruments.Now, output);
                }
                catch (UnitFaultException ex)
                {
                    await context.FaultUnitAsync(unit, ex.Message).ConfigureAwait(false);
                }
            }

            if (approach.Decide(context.Batch.Active) != PredictiveSettleOutcome.KeepWaiting)
            {
                return approach;
            }

            var verdict = window.Evaluate();
            if (verdict.IsStable && Math.Abs(verdict.Mean!.Value - setpoint.Celsius) <= stability.MaxOffsetFromSetpointC)
            {
                approach.FallBack($"the stability window was met before the prediction was certain enough ({Pending(approach, context.Batch.Active)})");
                return approach;
            }

            if (approach.Seconds(instruments.Now) > stability.TimeoutSeconds)
            {
                approach.FallBack($"no usable prediction within the timeout ({Pending(approach, context.Batch.Active)})");
                return approach;
            }

            // Rounds follow each other as fast as the instruments read (never slower than the sequence's sample
            // interval): the fits' uncertainty falls with the number of readings, and reading costs no extra time.
            var spent = (instruments.Now - roundStart).TotalSeconds;
            var interval = Math.Min(stability.SampleIntervalSeconds, MinimumRoundSeconds);
            if (interval > spent)
            {
                await instruments.DelayAsync(interval - spent, ct).ConfigureAwait(false);
            }
        }
    }

    /// <summary>
    /// Records, for every unit still in progress, how the setpoint settled (<see cref="SettleModeCodes"/>) and the fits'
    /// residuals, °C.
    /// </summary>
    public static void Record(StepContext context, SettleStep step, PredictiveApproach approach)
    {
        var now = context.Instruments.Now;
        var name = approach.Setpoint.Name;
        var code = approach.Taken ? SettleModeCodes.Predictive : SettleModeCodes.WindowFallback;
        var note = approach.Taken ? SettleModeCodes.Word(code) : $"{SettleModeCodes.Word(code)}: {approach.FallbackReason}";
        var referenceFit = approach.Reference.Last?.Fit;
        foreach (var unit in context.Batch.Active)
        {
            unit.Add(UnlimitedReading.Create(SettleModeCodes.ModeReading(name), code, "1") with
            { Step = step.DisplayName, Setpoint = name, At = now, Note = note });
            if (referenceFit is { Converged: true })
            {
                unit.Add(UnlimitedReading.Create(SettleModeCodes.ReferenceResidualReading(name), referenceFit.ResidualRms, "degC") with
                { Step = step.DisplayName, Setpoint = name, At = now, Samples = referenceFit.Readings });
            }

            if (approach.TrackerOf(unit)?.Last?.Fit is { Converged: true } fit)
            {
                unit.Add(UnlimitedReading.Create(SettleModeCodes.ResidualReading(name), fit.ResidualRms, "degC") with
                { Step = step.DisplayName, Setpoint = name, At = now, Samples = fit.Readings });
            }
        }
    }

    /// <summary>What the measure and verify steps at <paramref name="setpoint"/> read.</summary>
    private static IEnumerable<UnitRead> ReadsAt(SequenceDefinition sequence, string setpoint) =>
        sequence.Steps.Select(step => step switch
        {
            MeasureStep m when m.Setpoint == setpoint => m.Output == UnitOutputs.Link ? UnitRead.Raw : UnitRead.MeterVolts,
            VerifyStep v when v.Setpoint == setpoint => v.Output == UnitOutputs.Link ? UnitRead.Temperature : UnitRead.MeterVolts,
            _ => (UnitRead?)null,
        }).OfType<UnitRead>();

    /// <summary>Why a measure or verify step at <paramref name="setpoint"/> could not be moved to its final value, or null.</summary>
    private static string? Unconvertible(SequenceDefinition sequence, string setpoint) =>
        ReadsAt(sequence, setpoint).Any(r => SoakRunner.QuantityPerC(sequence, r) is null)
            ? "a step reads raw counts, and without soak.outputCountsPerC they cannot be moved to their final value"
            : null;

    private static string Pending(PredictiveApproach approach, IReadOnlyList<UnitContext> units)
    {
        var waiting = new List<string>();
        if (approach.Reference.Last is { Outcome: not PredictiveSettleOutcome.Take } r)
        {
            waiting.Add($"reference: {r.Why}");
        }

        foreach (var unit in units)
        {
            if (approach.TrackerOf(unit)?.Last is { Outcome: not PredictiveSettleOutcome.Take } u)
            {
                waiting.Add($"slot {unit.Slot.ToString(CultureInfo.InvariantCulture)}: {u.Why}");
            }
        }

        return waiting.Count == 0 ? "no readings" : string.Join("; ", waiting);
    }
}
