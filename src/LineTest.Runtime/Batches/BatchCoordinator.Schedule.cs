using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Throughput;
using LineTest.Runtime.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Batches;

/// <summary>The schedule side of the coordinator: step order, early commanding of the first setpoint, fixed waits.</summary>
public sealed partial class BatchCoordinator
{
    // The setpoint commanded ahead of its settle step, and when; touched only by the coordinator's one flow of control.
    private (string Name, DateTimeOffset At)? _preCommanded;

    /// <summary>
    /// The steps of this batch in the order to run them. Fast schedule: where the sequence's setpoint order is free,
    /// the independent settle blocks are ordered for least travel from the block's present temperature; and when
    /// only identify and supply-current steps come before the first settle, the first setpoint is commanded now so
    /// the block ramps while they run (neither needs a stable block).
    /// </summary>
    private async Task<IReadOnlyList<StepDefinition>> PlanStepsAsync(BatchState batch, CancellationToken ct)
    {
        _preCommanded = null;
        var sequence = batch.Request.Sequence;
        if (batch.Request.Schedule.Kind != BatchScheduleKind.Fast)
        {
            return sequence.Steps;
        }

        var steps = sequence.Steps;
        if (string.Equals(sequence.SetpointOrder, SetpointOrders.Free, StringComparison.Ordinal))
        {
            // The source's own control sensor is close enough to choose an order; it costs no reference reading.
            var blockC = 0.0;
            await SourceAsync(async token => blockC = await _rig.Source.ReadTemperatureAsync(token).ConfigureAwait(false), ct).ConfigureAwait(false);
            steps = SetpointPlan.Order(sequence, _fixture.Source, double.IsFinite(blockC) ? blockC : _fixture.Source.StandbyC);
            if (_logger.IsEnabled(LogLevel.Debug))
            {
                RuntimeLog.SetpointOrder(_logger, batch.Id, blockC, string.Join(", ", steps.OfType<SettleStep>().Select(s => s.Setpoint)));
            }
        }

        var first = steps.TakeWhile(s => s is IdentifyStep or SupplyCurrentStep).Count();
        if (first > 0 && first < steps.Count && steps[first] is SettleStep settle)
        {
            var setpoint = sequence.Setpoints.First(s => s.Name == settle.Setpoint);
            await CommandSetpointAsync(setpoint, ct).ConfigureAwait(false);
            _preCommanded = (setpoint.Name, _time.GetUtcNow());
            _observer.SourceChanged(setpoint.Celsius, null, "ramping");
        }

        return steps;
    }

    /// <summary>
    /// Commands <paramref name="setpoint"/> (after the safe-range guard) unless it was already commanded ahead of its
    /// settle step; returns when it was commanded.
    /// </summary>
    private async Task<DateTimeOffset> CommandSetpointAsync(SetpointDefinition setpoint, CancellationToken ct)
    {
        if (_preCommanded is { } early && string.Equals(early.Name, setpoint.Name, StringComparison.Ordinal))
        {
            _preCommanded = null;
            return early.At;
        }

        _preCommanded = null;
        var source = _fixture.Source;
        if (setpoint.Celsius < source.SafeMinC || setpoint.Celsius > source.SafeMaxC)
        {
            // The checker refuses such sequences; this guard protects against a fixture swapped after the check.
            throw new BatchFaultException(
                $"setpoint '{setpoint.Name}' ({F(setpoint.Celsius)} °C) is outside the safe range of fixture '{_fixture.Id}' ({F(source.SafeMinC)} … {F(source.SafeMaxC)} °C); nothing was sent to the source");
        }

        var commanded = _time.GetUtcNow();
        await SourceAsync(token => _rig.Source.SetSetpointAsync(setpoint.Celsius, token), ct).ConfigureAwait(false);
        return commanded;
    }

    /// <summary>
    /// Baseline settle: wait the schedule's fixed time from commanding, check the reference once (a fixed wait that
    /// ends off the setpoint is a fault, never a measurement), then soak for the fixed time.
    /// </summary>
    private async Task SettleFixedAsync(BatchState batch, SetpointDefinition setpoint, DateTimeOffset commanded, CancellationToken ct)
    {
        var schedule = batch.Request.Schedule;
        var stability = batch.Request.Sequence.Stability;
        var left = schedule.FixedSettleSeconds - (_time.GetUtcNow() - commanded).TotalSeconds - _timing.ReferenceReadSeconds;
        await DelayAsync(left, ct).ConfigureAwait(false);
        var celsius = await ReadReferenceAsync(ct).ConfigureAwait(false);
        if (Math.Abs(celsius - setpoint.Celsius) > stability.MaxOffsetFromSetpointC)
        {
            throw new BatchFaultException(
                $"after the fixed settle of {F(schedule.FixedSettleSeconds)} s the reference read {F(celsius)} °C, more than {F(stability.MaxOffsetFromSetpointC)} °C from '{setpoint.Name}' ({F(setpoint.Celsius)} °C)");
        }

        var stableAt = _time.GetUtcNow();
        var secondsToStable = (stableAt - commanded).TotalSeconds;
        RuntimeLog.SourceStable(_logger, setpoint.Name, setpoint.Celsius, celsius, secondsToStable);
        _observer.SourceChanged(setpoint.Celsius, celsius, "stable");
        foreach (var unit in batch.Active)
        {
            unit.Machine.SourceStable();
            Notify(batch, unit);
        }

        await DelayAsync(schedule.FixedSoakSeconds, ct).ConfigureAwait(false);
        var record = new SetpointRecord(setpoint.Name, setpoint.Celsius, celsius, secondsToStable, schedule.FixedSoakSeconds, stableAt);
        batch.SetpointHistory.Add(record);
        foreach (var unit in batch.Active)
        {
            unit.Setpoints.Add(record);
        }
    }
}
