using System.Globalization;
using LineTest.Core.Calibration;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>Runs a trim step with the DAC method: compute codes (<see cref="DacTrim"/>), range-check, write, store, read back.</summary>
internal static class DacTrimExecutor
{
    public static async Task RunAsync(StepContext context, SequenceDefinition sequence, TrimStep step, UnitContext unit, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var spec = sequence.Trim?.Dac ?? throw new InvalidOperationException("Checked sequences with a trim step have a DAC trim.");
        var points = TrimInputs.Points(step, unit, instruments.Fixture);
        // The trim predicts at its calibration points itself; checkpoints are the further setpoints only.
        var checkpoints = step.PredictAt.Except(step.Points, StringComparer.Ordinal)
            .Select(p => new TrimCheckpoint(p, sequence.Setpoints.First(s => s.Name == p).Celsius))
            .ToList();
        var name = step.DisplayName;
        var now = instruments.Now;
        var curve = TrimInputs.Curve(sequence, points, unit);
        var line = TrimAccuracy.Line(sequence, curve, points);
        var objective = TrimAccuracy.CodeObjectiveC(sequence, points);
        var result = DacTrim.Compute(spec, points, unit.Registers[spec.Gain.Register], unit.Registers[spec.Offset.Register], checkpoints, line, objective);
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
        AddCodes(unit, name, spec, trim.GainCode, trim.OffsetCode, now);
        if (!TrimInputs.RecordPrediction(sequence, step, unit, trim, curve, instruments.Fixture, now))
        {
            return;
        }

        var (gainCode, offsetCode) = (trim.GainCode, trim.OffsetCode);
        if (spec.CheckPairs is { } pairs)
        {
            var check = await CheckAsync(instruments, unit, trim, pairs, ChooseAgain(trim, line, objective), ct).ConfigureAwait(false);
            (gainCode, offsetCode) = (check.GainCode, check.OffsetCode);
            unit.Add(UnlimitedReading.Create($"{name}.check.residual", check.ResidualC, "degC") with
            {
                Step = name,
                At = instruments.Now,
                Note = check.Applied ? null : "the output did not move as a DAC step error would explain; codes left as computed for verify to judge",
            });
            // The code readings say what is stored: the checked codes (in range, as the check keeps them), in place.
            foreach (var (reading, code) in new[] { ($"{name}.gainCode", gainCode), ($"{name}.offsetCode", offsetCode) })
            {
                var index = unit.Readings.FindLastIndex(r => r.Name == reading);
                unit.Readings[index] = unit.Readings[index] with { Value = code };
            }

            unit.Trim = unit.Trim with
            {
                Values = new Dictionary<string, double>(unit.Trim.Values, StringComparer.Ordinal) { ["gainCode"] = gainCode, ["offsetCode"] = offsetCode },
                Inputs = new Dictionary<string, double>(unit.Trim.Inputs, StringComparer.Ordinal)
                {
                    ["check.residualVolts"] = check.ResidualVolts,
                    ["computed.gainCode"] = trim.GainCode,
                    ["computed.offsetCode"] = trim.OffsetCode,
                },
            };
        }

        var values = new Dictionary<string, long>(StringComparer.Ordinal) { [spec.Gain.Register] = gainCode, [spec.Offset.Register] = offsetCode };
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

    private static void AddCodes(UnitContext unit, string name, DacTrimSpec spec, long gainCode, long offsetCode, DateTimeOffset at)
    {
        unit.Add(new Reading($"{name}.gainCode", gainCode, "count", spec.Gain.Min, spec.Gain.Max,
            gainCode >= spec.Gain.Min && gainCode <= spec.Gain.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = at });
        unit.Add(new Reading($"{name}.offsetCode", offsetCode, "count", spec.Offset.Min, spec.Offset.Max,
            offsetCode >= spec.Offset.Min && offsetCode <= spec.Offset.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = at });
    }

    /// <summary>
    /// The differential check (<see cref="DacCheck"/>): the output read with the calibration codes (A) and the new codes (B)
    /// in the order A B B A A B …, two link writes and two meter readings per pair, at the temperature the unit is at now.
    /// </summary>
    private static async Task<DacCheckResult> CheckAsync(
        InstrumentGateway instruments, UnitContext unit, DacTrimResult trim, int pairs, Func<double, (long, long)>? chooseAgain, CancellationToken ct)
    {
        var spec = trim.Spec;
        var old = new Dictionary<string, long>(StringComparer.Ordinal)
        {
            [spec.Gain.Register] = trim.GainCodeAtCalibration, [spec.Offset.Register] = trim.OffsetCodeAtCalibration,
        };
        var computed = new Dictionary<string, long>(StringComparer.Ordinal) { [spec.Gain.Register] = trim.GainCode, [spec.Offset.Register] = trim.OffsetCode };
        double sumOld = 0, sumNew = 0;
        for (var i = 0; i < pairs; i++)
        {
            foreach (var useNew in i % 2 == 0 ? new[] { false, true } : [true, false])
            {
                var codes = useNew ? computed : old;
                await instruments.LinkAsync(unit.Slot, (link, token) => link.WriteTrimAsync(codes, token), ct).ConfigureAwait(false);
                var volts = await instruments.ReadUnitAsync(unit.Slot, UnitRead.MeterVolts, ct).ConfigureAwait(false);
                if (useNew)
                {
                    sumNew += volts;
                }
                else
                {
                    sumOld += volts;
                }
            }
        }

        return DacCheck.Evaluate(trim, sumOld / pairs, sumNew / pairs, chooseAgain);
    }

    /// <summary>The code search again with a measured output error added, over the same objective temperatures; null without them.</summary>
    private static Func<double, (long, long)>? ChooseAgain(DacTrimResult trim, TrimLine? line, IReadOnlyList<double>? objective)
    {
        if (objective is not { Count: > 0 })
        {
            return null;
        }

        var spec = trim.Spec;
        var outputs = objective.Select(t => line?.OutputAt(t) ?? trim.Fit.Evaluate(t)).ToArray();
        return shift =>
        {
            var chosen = DacCodeSearch.Choose(spec, DacTrim.GainFactor(spec.Gain, trim.GainCodeAtCalibration),
                DacTrim.OffsetVolts(spec.Offset, trim.OffsetCodeAtCalibration), objective, outputs, trim.GainCode, trim.OffsetCode, shift);
            return (chosen.GainCode, chosen.OffsetCode);
        };
    }
}
