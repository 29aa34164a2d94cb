using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Batches;

/// <summary>Runs a trim step with the DAC method: compute codes, range-check, write, store, read back.</summary>
internal sealed class DacTrimExecutor
{
    private readonly BatchCoordinator _coordinator;

    public DacTrimExecutor(BatchCoordinator coordinator) => _coordinator = coordinator;

    public async Task RunAsync(SequenceDefinition sequence, TrimStep step, UnitContext unit, CancellationToken ct)
    {
        var spec = sequence.Trim?.Dac ?? throw new InvalidOperationException("Checked sequences with a trim step have a DAC trim.");
        var points = step.Points.Select(p => unit.CalibrationPoints[p]).ToList();

        // Least-squares line through the calibration points: output = a + b·T.
        var n = points.Count;
        var meanT = points.Average(p => p.ReferenceC);
        var meanV = points.Average(p => p.Output);
        var sxx = points.Sum(p => (p.ReferenceC - meanT) * (p.ReferenceC - meanT));
        var sxy = points.Sum(p => (p.ReferenceC - meanT) * (p.Output - meanV));
        var b = sxy / sxx;
        var a = meanV - b * meanT;
        _ = n;
        var g0 = unit.Registers[spec.Gain.Register];
        var o0 = unit.Registers[spec.Offset.Register];
        var gainFactor = (double g) => 1 + spec.Gain.Step * (g - spec.Gain.Nominal);
        var offsetVolts = (double o) => spec.Offset.Step * (o - spec.Offset.Nominal);
        var name = step.DisplayName;
        if (!(b * spec.Target.SlopeVoltsPerC > 0))
        {
            unit.Add(new Reading($"{name}.slope", b * 1000, "mV/degC", null, null, Verdict.Fail)
            {
                Step = name,
                Note = "sensor slope has the wrong sign or is zero: open or reversed sensor?",
            });
            return;
        }

        var gIdeal = spec.Gain.Nominal + (gainFactor(g0) * spec.Target.SlopeVoltsPerC / b - 1) / spec.Gain.Step;
        var g = (long)Math.Round(gIdeal);
        var ratio = gainFactor(g) / gainFactor(g0);
        var oIdeal = spec.Offset.Nominal + (spec.Target.OffsetVolts - ratio * (a - offsetVolts(o0))) / spec.Offset.Step;
        var o = (long)Math.Round(oIdeal);
        var predicted = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var setpoint in step.Points.Concat(step.PredictAt).Distinct())
        {
            var t = sequence.Setpoints.First(s => s.Name == setpoint).Celsius;
            var vOut = ratio * (a + b * t - offsetVolts(o0)) + offsetVolts(o);
            predicted[setpoint] = (vOut - spec.Target.VoltsAt(t)) / spec.Target.SlopeVoltsPerC;
        }

        var inRange = g >= spec.Gain.Min && g <= spec.Gain.Max && o >= spec.Offset.Min && o <= spec.Offset.Max;
        unit.Trim = new TrimRecord(
            "dac",
            new Dictionary<string, double> { ["fitOffsetVolts"] = a, ["fitSlopeVoltsPerC"] = b, ["gainCodeBefore"] = g0, ["offsetCodeBefore"] = o0 },
            new Dictionary<string, double> { [spec.Gain.Register] = g, [spec.Offset.Register] = o },
            predicted,
            inRange,
            []);
        var now = _coordinator.Now;
        unit.Add(new Reading($"{name}.gainCode", g, "count", spec.Gain.Min, spec.Gain.Max,
            g >= spec.Gain.Min && g <= spec.Gain.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = now });
        unit.Add(new Reading($"{name}.offsetCode", o, "count", spec.Offset.Min, spec.Offset.Max,
            o >= spec.Offset.Min && o <= spec.Offset.Max ? Verdict.Pass : Verdict.Fail) { Step = name, At = now });
        unit.Add(ReadingJudge.Record($"{name}.slope", b * 1000, "mV/degC") with { Step = name, At = now });
        if (!inRange)
        {
            unit.FirstFailureReason = $"trim out of range: gain code {g} (allowed {spec.Gain.Min} … {spec.Gain.Max}), offset code {o} (allowed {spec.Offset.Min} … {spec.Offset.Max})";
            return;
        }

        var values = new Dictionary<string, long>(StringComparer.Ordinal) { [spec.Gain.Register] = g, [spec.Offset.Register] = o };
        await _coordinator.LinkAsync(unit, (link, token) => link.WriteTrimAsync(values, token), ct).ConfigureAwait(false);
        await _coordinator.DelayAsync(_coordinator.StoreSeconds, ct).ConfigureAwait(false);
        await _coordinator.LinkAsync(unit, (link, token) => link.StoreAsync(token), ct).ConfigureAwait(false);
        var readBack = await _coordinator.LinkAsync(unit, (link, token) => link.ReadBackAsync(token), ct).ConfigureAwait(false);
        foreach (var (register, value) in values)
        {
            if (!readBack.TryGetValue(register, out var stored) || stored != value)
            {
                throw new UnitFaultException(
                    $"trim read-back differs in slot {unit.Slot}: register {register} wrote {value}, read back {(readBack.TryGetValue(register, out var s) ? s.ToString(System.Globalization.CultureInfo.InvariantCulture) : "nothing")}");
            }

            unit.Registers[register] = value;
        }
    }
}
