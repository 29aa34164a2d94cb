using LineTest.Core.Calibration;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a trim step with the firmware coefficient method: fit temperature against the unit's raw counts
/// (<see cref="FirmwareTrim"/>), range-check the register values, write them, store, read back and compare
/// (<see cref="FirmwareTrim.CheckReadBack"/>); a mismatch ends the unit in error naming the register.
/// </summary>
internal static class FirmwareTrimExecutor
{
    public static async Task RunAsync(StepContext context, SequenceDefinition sequence, TrimStep step, UnitContext unit, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var spec = sequence.Trim?.Firmware ?? throw new InvalidOperationException("Checked sequences with method 'firmware' have a firmware trim.");
        var name = step.DisplayName;
        var now = instruments.Now;
        var points = TrimInputs.Points(step, unit, context.Instruments.Fixture);
        var curve = TrimInputs.Curve(sequence, points, unit);
        var result = FirmwareTrim.Compute(spec, points, TrimInputs.ExtraCheckpoints(sequence, step), TrimAccuracy.FirmwareFitPoints(sequence, curve));
        if (!result.TryGetValue(out var trim))
        {
            unit.Add(new Reading($"{name}.computed", null, "1", null, null, Verdict.Fail)
            {
                Step = name,
                At = now,
                Note = $"{name}: no coefficients could be computed: {result.Reason}",
            });
            return;
        }

        unit.Trim = trim.ToRecord();
        unit.Add(UnlimitedReading.Create($"{name}.fit.maxAbsResidual", trim.Fit.MaxAbsResidual, "degC") with { Step = name, At = now });
        unit.Add(UnlimitedReading.Create($"{name}.quantisationBound", trim.QuantisationBoundC, "degC") with { Step = name, At = now });
        for (var i = 0; i < trim.Registers.Count; i++)
        {
            var register = trim.Registers[i];
            var declared = spec.Coefficients[i];
            var inRange = register.Value >= declared.MinValue && register.Value <= declared.MaxValue;
            unit.Add(new Reading($"{name}.{register.Register}", register.Value, "count", declared.MinValue, declared.MaxValue,
                inRange ? Verdict.Pass : Verdict.Fail) { Step = name, At = now });
        }

        if (!TrimInputs.RecordPrediction(sequence, step, unit, trim, curve, instruments.Fixture, now))
        {
            return;
        }

        var values = trim.Registers.ToDictionary(r => r.Register, r => r.Value, StringComparer.Ordinal);
        var readBack = await TrimInputs.WriteStoreReadBackAsync(instruments, unit.Slot, values, ct).ConfigureAwait(false);
        var check = FirmwareTrim.CheckReadBack(trim, readBack);
        if (!check.Succeeded)
        {
            throw new UnitFaultException($"trim read-back differs in slot {unit.Slot}: {check.Reason}");
        }

        foreach (var (register, value) in values)
        {
            unit.Registers[register] = value;
        }
    }
}
