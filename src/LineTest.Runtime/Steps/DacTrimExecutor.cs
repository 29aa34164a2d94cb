using System.Globalization;
using LineTest.Core.Calibration;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>Runs a trim step with the DAC method: compute codes (<see cref="DacTrim"/>), range-check, write, store, read back.</summary>
internal static class DacTrimExecutor
{
    public static async Task RunAsync(StepContext context, SequenceDefinition sequence, TrimStep step, UnitContext unit, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var spec = sequence.Trim?.Dac ?? throw new InvalidOperationException("Checked sequences with a trim step have a DAC trim.");
        var points = step.Points
            .Select(p => new CalibrationPoint(p, unit.CalibrationPoints[p].ReferenceC, unit.CalibrationPoints[p].Output))
            .ToList();
        // The trim predicts at its calibration points itself; checkpoints are the further setpoints only.
        var checkpoints = step.PredictAt.Except(step.Points, StringComparer.Ordinal)
            .Select(p => new TrimCheckpoint(p, sequence.Setpoints.First(s => s.Name == p).Celsius))
            .ToList();
        var name = step.DisplayName;
        var now = instruments.Now;
        var curve = TrimInputs.Curve(sequence, points, unit);
        var result = DacTrim.Compute(spec, points, unit.Registers[spec.Gain.Register], unit.Registers[spec.Offset.Register], checkpoints,
            TrimAccuracy.Line(sequence, curve, points), TrimAccuracy.CodeObjectiveC(sequence, points));
        if (!result.TryGetValue(out var trim))
        {
            unit.Add(new Reading($"{name}.computed", null, "1", null, null, Verdict.Fail)
            {
                Step = name,
                At = now,
                Note = $"{name}: no trim could be computed: {result.Reason}",
            });
            return;
        }

        unit.Trim = trim.ToRecord();
        unit.Add(UnlimitedReading.Create($"{name}.slope", trim.Fit.Slope * 1000, "mV/degC") with { Step = name, At = now });
        unit.Add(new Reading($"{name}.gainCode", trim.GainCode, "count", spec.Gain.Min, spec.Gain.Max,
            trim.GainCode >= spec.Gain.Min && trim.GainCode <= spec.Gain.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = now });
        unit.Add(new Reading($"{name}.offsetCode", trim.OffsetCode, "count", spec.Offset.Min, spec.Offset.Max,
            trim.OffsetCode >= spec.Offset.Min && trim.OffsetCode <= spec.Offset.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = now });
        if (!TrimInputs.RecordPrediction(sequence, step, unit, trim, curve, instruments.Fixture, now))
        {
            return;
        }

        var values = trim.Registers.ToDictionary(r => r.Key, r => r.Value, StringComparer.Ordinal);
        var readBack = await TrimInputs.WriteStoreReadBackAsync(instruments, unit.Slot, values, ct).ConfigureAwait(false);
        foreach (var (register, value) in values)
        {
            if (!readBack.TryGetValue(register, out var stored) || stored != value)
            {
                var got = readBack.TryGetValue(register, out var s) ? s.ToString(CultureInfo.InvariantCulture) : "nothing";
                throw new UnitFaultException($"trim read-back differs in slot {unit.Slot}: register {register} wrote {value}, read back {got}");
            }

            unit.Registers[register] = value;
        }
    }
}
