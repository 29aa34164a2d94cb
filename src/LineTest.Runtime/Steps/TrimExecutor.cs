using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>Runs a <see cref="TrimStep"/> unit by unit with the sequence's trim method (DAC, resistor or firmware).</summary>
internal sealed class TrimExecutor : StepExecutor<TrimStep>
{
    protected override Task RunAsync(StepContext context, TrimStep step, CancellationToken ct) =>
        context.ForEachUnitAsync(async unit =>
        {
            unit.Machine.BeginTrim();
            context.Notify(unit);
            var sequence = context.Sequence;
            var run = sequence.Trim?.Method switch
            {
                TrimMethods.Dac => DacTrimExecutor.RunAsync(context, sequence, step, unit, ct),
                TrimMethods.Resistor => ResistorTrimExecutor.RunAsync(context, sequence, step, unit, ct),
                TrimMethods.Firmware => FirmwareTrimExecutor.RunAsync(context, sequence, step, unit, ct),
                var method => throw new InvalidOperationException($"Trim method '{method}' has no executor (the checker accepts only known methods)."),
            };
            await run.ConfigureAwait(false);
        });
}
