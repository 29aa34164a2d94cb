using LineTest.Core.Decisions;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a <see cref="MeasureStep"/> for the whole batch: sample rounds of the reference and every unit's output (meter
/// volts or raw counts over the link), kept as the unit's calibration point at the setpoint and recorded with their
/// uncertainty (<see cref="StationBudgets.UnitOutput"/>); optional limits on the output catch gross faults. After a
/// predictive settle the samples are moved to the extrapolated final values and the extrapolation is a line of the budget.
/// </summary>
internal sealed class MeasureExecutor : StepExecutor<MeasureStep>
{
    protected override async Task RunAsync(StepContext context, MeasureStep step, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var units = context.Batch.Active;
        foreach (var unit in units)
        {
            unit.Machine.BeginMeasure();
            context.Notify(unit);
        }

        var overLink = step.Output == UnitOutputs.Link;
        var read = overLink ? UnitRead.Raw : UnitRead.MeterVolts;
        var (rawReferences, referenceTimes, outputs) = await SampleRounds.TakeAsync(context, units, read, step.Samples, ct).ConfigureAwait(false);

        // Predictive mode: every sample moved to its final value along the fitted approach, the fit's u(y∞) its own
        // component of the budget.
        var approach = context.Batch.Predictions.GetValueOrDefault(step.Setpoint);
        var references = SampleRounds.ReferencesAtFinal(approach, rawReferences, referenceTimes);
        var refMean = references.Average();
        var referenceBudget = instruments.ReferenceBudget(references);
        var refU = (approach is null ? referenceBudget : StationBudgets.Predicted(referenceBudget, StationBudgets.Extrapolation(approach.Reference.Last!.Fit))).Expand();
        var now = instruments.Now;
        foreach (var (unit, rawSamples, times) in outputs)
        {
            var samples = SampleRounds.OutputsAtFinal(context, approach, unit, read, rawSamples, times);
            var mean = samples.Average();
            var budget = StationBudgets.UnitOutput(instruments.Fixture.Meter, samples, overLink);
            var u = (approach?.TrackerOf(unit)?.Last?.Fit is { } fit
                ? StationBudgets.Predicted(budget, StationBudgets.Extrapolation(fit, SampleRounds.ShiftPerUnitScale(context, approach, unit, read)))
                : budget).Expand();
            unit.CalibrationPoints[step.Setpoint] = (refMean, mean);
            unit.Add(UnlimitedReading.Create($"{step.DisplayName}.reference", refMean, "degC", refU) with
            { Step = step.DisplayName, Setpoint = step.Setpoint, Samples = step.Samples, At = now });
            Reading output;
            if (step.OutputLimits is { } limits)
            {
                var scale = UnitsOfMeasure.FromBase(1, limits.Unit);
                output = ReadingFactory.Create($"{step.DisplayName}.output", mean * scale, limits,
                    new ExpandedUncertainty(u.StandardUncertainty * scale, u.CoverageFactor), step.Samples, now);
            }
            else
            {
                output = UnlimitedReading.Create($"{step.DisplayName}.output", mean, overLink ? "count" : "V", u) with { Samples = step.Samples, At = now };
            }

            unit.Add(output with { Step = step.DisplayName, Setpoint = step.Setpoint });
        }
    }
}
