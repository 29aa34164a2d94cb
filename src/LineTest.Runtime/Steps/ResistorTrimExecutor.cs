using LineTest.Core.Calibration;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Trims;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a trim step with the select-on-test resistor method: choose the parts (<see cref="ResistorTrim"/>),
/// range-check, record them with the predicted error, tell the operator what to fit (one prompt per unit), wait for
/// the confirmation and report the fitted parts (<see cref="IPartFitting"/>).
/// </summary>
/// <remarks>
/// The unit has no trim registers, so nothing is written over its link: the run's trim record (chosen values and
/// instructions) and the <c>.fitted</c> reading are the station's record of what the operator confirmed.
/// </remarks>
internal static class ResistorTrimExecutor
{
    public static async Task RunAsync(StepContext context, SequenceDefinition sequence, TrimStep step, UnitContext unit, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var spec = sequence.Trim?.Resistor ?? throw new InvalidOperationException("Checked sequences with method 'resistor' have a resistor trim.");
        var name = step.DisplayName;
        var now = instruments.Now;
        var points = TrimInputs.Points(step, unit, context.Instruments.Fixture);
        var curve = TrimInputs.Curve(sequence, points, unit);
        var result = ResistorTrim.Compute(spec, points, TrimInputs.ExtraCheckpoints(sequence, step), TrimAccuracy.Line(sequence, curve, points));
        if (!result.TryGetValue(out var trim))
        {
            unit.Add(new Reading($"{name}.computed", null, "1", null, null, Verdict.Fail)
            {
                Step = name,
                At = now,
                Note = $"{name}: no parts could be chosen: {result.Reason}",
            });
            return;
        }

        unit.Trim = trim.ToRecord();
        unit.Add(UnlimitedReading.Create($"{name}.slope", trim.Fit.Slope * 1000, "mV/degC") with { Step = name, At = now });
        AddPosition(unit, name, now, trim.Gain, spec.Gain.MinOhms, spec.Gain.MaxOhms);
        AddPosition(unit, name, now, trim.Offset, spec.Offset.MinOhms, spec.Offset.MaxOhms);
        if (!TrimInputs.RecordPrediction(sequence, step, unit, trim, curve, instruments.Fixture, now))
        {
            return;
        }

        var prompt = PromptText(unit, trim.Instructions);
        await context.PromptOperatorAsync(unit, prompt, ct).ConfigureAwait(false);
        await (context.PartFitting?.PartsFittedAsync(unit.Slot, unit.Serial, [trim.Gain, trim.Offset], ct) ?? Task.CompletedTask).ConfigureAwait(false);
        unit.Add(new Reading($"{name}.fitted", 1, "1", null, null, Verdict.Pass)
        {
            Step = name,
            At = instruments.Now,
            Note = $"operator confirmed: {string.Join("; ", trim.Instructions)}",
        });
    }

    /// <summary>E.g. <c>Slot 3 (CTP40R-2612-000007): Fit 9.31 kΩ (E96) in position R7 and 71.5 kΩ (E96) in position R8, then press Enter</c>.</summary>
    internal static string PromptText(UnitContext unit, IReadOnlyList<string> instructions)
    {
        var parts = instructions.Select((text, i) => i == 0 || !text.StartsWith("Fit ", StringComparison.Ordinal) ? text : text["Fit ".Length..]);
        return $"Slot {unit.Slot} ({unit.Serial}): {string.Join(" and ", parts)}, then press Enter";
    }

    private static void AddPosition(UnitContext unit, string name, DateTimeOffset now, ResistorChoice choice, double minOhms, double maxOhms)
    {
        // The value the trim asked for is judged against the position's range; the part(s) chosen are recorded as fitted.
        var inRange = choice.IdealOhms >= minOhms && choice.IdealOhms <= maxOhms;
        unit.Add(new Reading($"{name}.{choice.Position}.ideal", choice.IdealOhms, "ohm", minOhms, maxOhms, inRange ? Verdict.Pass : Verdict.Fail)
        {
            Step = name,
            At = now,
        });
        unit.Add(UnlimitedReading.Create($"{name}.{choice.Position}", choice.EffectiveOhms, "ohm") with { Step = name, At = now });
    }
}
