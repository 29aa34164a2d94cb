using LineTest.Core.Decisions;
using LineTest.Core.Sequences;

namespace LineTest.Runtime.Steps;

/// <summary>Runs a <see cref="SupplyCurrentStep"/>: each unit's supply current from the meter across its slot's shunt, judged against limits.</summary>
internal sealed class SupplyCurrentExecutor : StepExecutor<SupplyCurrentStep>
{
    protected override Task RunAsync(StepContext context, SupplyCurrentStep step, CancellationToken ct) =>
        context.ForEachUnitAsync(async unit =>
        {
            unit.Machine.BeginSupplyCheck();
            context.Notify(unit);
            var instruments = context.Instruments;
            var slot = instruments.SlotOf(unit.Slot);
            var amps = new double[step.Samples];
            for (var i = 0; i < step.Samples; i++)
            {
                var volts = await instruments.ReadMeterAsync(slot.SupplyChannel, ct).ConfigureAwait(false);
                amps[i] = volts / slot.SupplyShuntOhms;
            }

            var mean = amps.Average();
            var budget = StationBudgets.SupplyCurrent(instruments.Fixture.Meter, amps, slot.SupplyShuntOhms);
            var scale = UnitsOfMeasure.FromBase(1, step.Limits.Unit);
            var u = budget.Expand();
            var reading = ReadingFactory.Create(step.DisplayName, mean * scale, step.Limits,
                new ExpandedUncertainty(u.StandardUncertainty * scale, u.CoverageFactor), step.Samples, instruments.Now) with
            { Step = step.DisplayName };
            unit.Add(reading);
        });
}
