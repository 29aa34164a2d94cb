using LineTest.Core.Decisions;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a <see cref="MeasureStep"/> for the whole batch: sample rounds of the reference and every unit's output (meter
/// volts or raw counts over the link), kept as the unit's calibration point at the setpoint and recorded with their
/// uncertainty (<see cref="StationBudgets.UnitOutput"/>); optional limits on the output catch gross faults.
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
        var (references, outputs) = await SampleRounds.TakeAsync(context, units, overLink ? UnitRead.Raw : UnitRead.MeterVolts, step.Samples, ct)
            .ConfigureAwait(false);
        var refMean = references.Average();
        var refU = instruments.ReferenceBudget(references).Expand();
        var now = instruments.Now;
        foreach (var (unit, samples) in outputs)
        {
            var mean = samples.Average();
            var u = StationBudgets.UnitOutput(instruments.Fixture.Meter, samples, overLink).Expand();
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
