using LineTest.Core.Sequences;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Steps;

/// <summary>Runs an <see cref="IdentifyStep"/>: each unit must report the scanned serial and the sequence's product.</summary>
internal sealed class IdentifyExecutor : StepExecutor<IdentifyStep>
{
    protected override Task RunAsync(StepContext context, IdentifyStep step, CancellationToken ct) =>
        context.ForEachUnitAsync(async unit =>
        {
            unit.Machine.BeginIdentify();
            context.Notify(unit);
            var identity = await context.Instruments.LinkAsync(unit.Slot, (link, token) => link.IdentifyAsync(token), ct).ConfigureAwait(false);
            unit.Firmware = identity.Firmware;
            if (!string.Equals(identity.Serial, unit.Serial, StringComparison.Ordinal))
            {
                throw new UnitFaultException(
                    $"the unit in slot {unit.Slot} reports serial '{identity.Serial}' but '{unit.Serial}' was scanned: check the unit is in the right slot");
            }

            var sequence = context.Sequence;
            if (!string.Equals(identity.Product, sequence.Product, StringComparison.Ordinal))
            {
                throw new UnitFaultException(
                    $"the unit in slot {unit.Slot} is a '{identity.Product}', but sequence '{sequence.Id}' tests '{sequence.Product}'");
            }
        });
}
