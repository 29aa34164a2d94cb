using LineTest.Core.Decisions;
using LineTest.Core.Sequences;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a <see cref="VerifyStep"/> for the whole batch: sample rounds of the reference and every unit's indicated
/// temperature (its output volts through the trim's target transfer, or the °C it reports over its link), and judges
/// the mean error (indicated − reference) against the limits with its uncertainty
/// (<see cref="StationBudgets.IndicatedError"/>). After a predictive settle the samples are moved to the extrapolated final
/// values and both extrapolations are lines of the budget, so the guard band widens by them.
/// </summary>
internal sealed class VerifyExecutor : StepExecutor<VerifyStep>
{
    protected override async Task RunAsync(StepContext context, VerifyStep step, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var units = context.Batch.Active;
        foreach (var unit in units)
        {
            unit.Machine.BeginVerify();
            context.Notify(unit);
        }

        var overLink = step.Output == UnitOutputs.Link;
        var read = overLink ? UnitRead.Temperature : UnitRead.MeterVolts;
        var (rawReferences, referenceTimes, outputs) = await SampleRounds.TakeAsync(context, units, read, step.Samples, ct).ConfigureAwait(false);
        var target = context.Sequence.Trim?.AnalogTarget;
        var slope = target?.SlopeVoltsPerC ?? context.Sequence.Soak.OutputVoltsPerC ?? 0.01;
        var offset = target?.OffsetVolts ?? 0;

        // Predictive mode: the reference and each unit moved to their final values; both extrapolations enter the error's
        // budget as their own components (the unit's through its indicated °C per °C of its own scale).
        var approach = context.Batch.Predictions.GetValueOrDefault(step.Setpoint);
        var references = SampleRounds.ReferencesAtFinal(approach, rawReferences, referenceTimes);
        var referenceBudget = instruments.ReferenceBudget(references);
        // Only a taken approach is kept for the setpoint, so its reference fit is converged: one component for every unit.
        var referenceExtrapolation = approach is null ? null : StationBudgets.Extrapolation(approach.Reference.Last!.Fit);
        var now = instruments.Now;
        foreach (var (unit, rawValues, times) in outputs)
        {
            var values = SampleRounds.OutputsAtFinal(context, approach, unit, read, rawValues, times);
            // Over the link the unit reports °C itself; from the meter its volts go through the target transfer. The unit's
            // well is the reference's plus the slot's well offset from the fixture's calibration.
            var wellOffset = instruments.Fixture.WellOffsetC(unit.Slot);
            var errors = new double[values.Length];
            for (var i = 0; i < values.Length; i++)
            {
                errors[i] = (overLink ? values[i] : (values[i] - offset) / slope) - (references[i] + wellOffset);
            }

            var meanError = errors.Average();
            var meanVolts = values.Average();
            var budget = StationBudgets.IndicatedError(instruments.Fixture.Meter, errors, meanVolts, slope, overLink, referenceBudget);
            var referenceReported = referenceBudget;
            if (approach?.TrackerOf(unit)?.Last?.Fit is { } fit)
            {
                var perUnitScale = SampleRounds.ShiftPerUnitScale(context, approach, unit, read);
                var indicatedPerC = overLink ? perUnitScale : perUnitScale / slope;
                budget = StationBudgets.Predicted(budget, referenceExtrapolation! with { Name = "reference " + referenceExtrapolation.Name },
                    StationBudgets.Extrapolation(fit, indicatedPerC));
                referenceReported = StationBudgets.Predicted(referenceBudget, referenceExtrapolation!);
            }

            var u = budget.Expand();
            unit.Add(UnlimitedReading.Create($"{step.DisplayName}.reference", references.Average(), "degC", referenceReported.Expand()) with
            { Step = step.DisplayName, Setpoint = step.Setpoint, Samples = step.Samples, At = now });
            unit.Add(ReadingFactory.Create(step.DisplayName, meanError, step.Limits, u, step.Samples, now) with
            { Step = step.DisplayName, Setpoint = step.Setpoint });
        }
    }
}
