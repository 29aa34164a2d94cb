using LineTest.Core.Sequences;
using LineTest.Core.Sequences.Steps;
using LineTest.Core.Throughput;
using LineTest.Runtime.Logging;
using LineTest.Runtime.Steps;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Batches;

/// <summary>The schedule of a batch: the order of its steps, and commanding the first setpoint early.</summary>
internal static class BatchPlanner
{
    /// <summary>
    /// The steps of this batch in the order to run them. Fast schedule: where the sequence's setpoint order is free,
    /// the independent settle blocks are ordered for least travel from the block's present temperature
    /// (<see cref="SetpointPlan"/>); and when only steps that run while the source ramps
    /// (<see cref="IStepKind.RunsWhileSourceRamps"/>: identify, supply-current) come before the first settle, the
    /// first setpoint is commanded now (<see cref="BatchState.PreCommanded"/>) so the block ramps while they run.
    /// </summary>
    public static async Task<IReadOnlyList<StepDefinition>> PlanAsync(StepContext context, CancellationToken ct)
    {
        var batch = context.Batch;
        var instruments = context.Instruments;
        var fixture = instruments.Fixture;
        var sequence = batch.Request.Sequence;
        if (batch.Request.Schedule.Kind != BatchScheduleKind.Fast)
        {
            return sequence.Steps;
        }

        var steps = sequence.Steps;
        if (string.Equals(sequence.SetpointOrder, SetpointOrders.Free, StringComparison.Ordinal))
        {
            // The source's own control sensor is close enough to choose an order; it costs no reference reading.
            var blockC = await instruments.ReadSourceTemperatureAsync(ct).ConfigureAwait(false);
            steps = SetpointPlan.Order(sequence, fixture.Source, double.IsFinite(blockC) ? blockC : fixture.Source.StandbyC);
            if (context.Logger.IsEnabled(LogLevel.Debug))
            {
                RuntimeLog.SetpointOrder(context.Logger, batch.Id, blockC, string.Join(", ", steps.OfType<SettleStep>().Select(s => s.Setpoint)));
            }
        }

        var first = steps.TakeWhile(s => StepKinds.Of(s).RunsWhileSourceRamps).Count();
        if (first > 0 && first < steps.Count && StepKinds.Of(steps[first]) is { PlannerRole: PlannerRole.Settle } settle)
        {
            var name = settle.SetpointOf(steps[first]);
            var setpoint = sequence.Setpoints.First(s => s.Name == name);
            await instruments.CommandSetpointAsync(setpoint, ct).ConfigureAwait(false);
            batch.PreCommanded = (setpoint.Name, instruments.Now);
            context.Observer.SourceChanged(setpoint.Celsius, null, "ramping");
        }

        return steps;
    }
}
