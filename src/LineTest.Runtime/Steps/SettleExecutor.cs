using System.Globalization;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Logging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs a <see cref="SettleStep"/> for the whole batch (the units share one source): command the setpoint (unless it
/// was commanded ahead, see <see cref="BatchState.PreCommanded"/>), wait until the reference is stable within the
/// sequence's band and near the setpoint, then soak the units (<see cref="SoakRunner"/>). In predictive mode
/// (<see cref="PredictiveSettleRunner"/>) the readings are taken from the fitted approach as soon as its extrapolation is
/// certain enough, with no soak; a fallback goes on as in window mode and records why. The baseline schedule waits
/// fixed times instead (and ignores the settle mode). A source that never settles stops the batch.
/// </summary>
internal sealed class SettleExecutor : StepExecutor<SettleStep>
{
    /// <summary>
    /// Commands <paramref name="setpoint"/> (after the safe-range guard) unless it was already commanded ahead of its
    /// settle step; returns when it was commanded.
    /// </summary>
    public static async Task<DateTimeOffset> CommandSetpointAsync(StepContext context, SetpointDefinition setpoint, CancellationToken ct)
    {
        var batch = context.Batch;
        if (batch.PreCommanded is { } early && string.Equals(early.Name, setpoint.Name, StringComparison.Ordinal))
        {
            batch.PreCommanded = null;
            return early.At;
        }

        batch.PreCommanded = null;
        return await context.Instruments.CommandSetpointAsync(setpoint, ct).ConfigureAwait(false);
    }

    protected override async Task RunAsync(StepContext context, SettleStep step, CancellationToken ct)
    {
        var batch = context.Batch;
        var instruments = context.Instruments;
        var sequence = context.Sequence;
        var setpoint = sequence.Setpoints.First(s => s.Name == step.Setpoint);
        foreach (var unit in batch.Active)
        {
            unit.Machine.AwaitSource();
            context.Notify(unit);
        }

        var commanded = await CommandSetpointAsync(context, setpoint, ct).ConfigureAwait(false);
        context.Observer.SourceChanged(setpoint.Celsius, null, "ramping");
        if (batch.Request.Schedule.Kind == BatchScheduleKind.Baseline)
        {
            await SettleFixedAsync(context, setpoint, commanded, ct).ConfigureAwait(false);
            return;
        }

        var stability = sequence.Stability;
        var window = new StabilityWindow(stability.WindowSeconds, stability.BandC, stability.MaxDriftCPerMinute);
        batch.Predictions.Remove(setpoint.Name);
        var settle = SettleSettings.For(sequence, setpoint.Name);
        PredictiveApproach? approach = null;
        if (settle.Mode == SettleModes.Predictive)
        {
            approach = await PredictiveSettleRunner.ApproachAsync(context, setpoint, settle, commanded, window, ct).ConfigureAwait(false);
            if (approach.Taken)
            {
                var takenAt = instruments.Now;
                var fit = approach.Reference.Last!.Fit;
                RuntimeLog.PredictiveTaken(context.Logger, setpoint.Name, setpoint.Celsius, (takenAt - commanded).TotalSeconds, fit.FinalValue,
                    fit.FinalValueStandardUncertainty);
                context.Observer.SourceChanged(setpoint.Celsius, fit.FinalValue, "stable");
                SourceStable(context);
                batch.Predictions[setpoint.Name] = approach;
                PredictiveSettleRunner.Record(context, step, approach);
                Record(batch, new SetpointRecord(setpoint.Name, setpoint.Celsius, fit.FinalValue, (takenAt - commanded).TotalSeconds, 0, takenAt));
                return;
            }

            RuntimeLog.PredictiveFellBack(context.Logger, setpoint.Name, approach.FallbackReason ?? "unknown");
        }

        var verdict = await WaitForWindowAsync(context, setpoint, commanded, window, ct).ConfigureAwait(false);
        var stableAt = instruments.Now;
        var secondsToStable = (stableAt - commanded).TotalSeconds;
        RuntimeLog.SourceStable(context.Logger, setpoint.Name, setpoint.Celsius, verdict.Mean!.Value, secondsToStable);
        context.Observer.SourceChanged(setpoint.Celsius, verdict.Mean, "stable");
        SourceStable(context);
        var soakSeconds = await SoakRunner.SoakAsync(context, ct).ConfigureAwait(false);
        if (approach is not null)
        {
            PredictiveSettleRunner.Record(context, step, approach);
        }

        Record(batch, new SetpointRecord(setpoint.Name, setpoint.Celsius, verdict.Mean, secondsToStable, soakSeconds, stableAt));
    }

    /// <summary>
    /// Window mode: reads the reference every sample interval until the window is stable near the setpoint; a source
    /// that does not get there within the timeout stops the batch.
    /// </summary>
    private static async Task<StabilityVerdict> WaitForWindowAsync(
        StepContext context, SetpointDefinition setpoint, DateTimeOffset commanded, StabilityWindow window, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var stability = context.Sequence.Stability;
        while (true)
        {
            var wait = stability.SampleIntervalSeconds - instruments.Timing.ReferenceReadSeconds;
            if (wait > 0)
            {
                await instruments.DelayAsync(wait, ct).ConfigureAwait(false);
            }

            var celsius = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
            var elapsed = (instruments.Now - commanded).TotalSeconds;
            window.Add(elapsed, celsius);
            var verdict = window.Evaluate();
            context.Observer.SourceChanged(setpoint.Celsius, celsius, "settling");
            if (verdict.IsStable && Math.Abs(verdict.Mean!.Value - setpoint.Celsius) <= stability.MaxOffsetFromSetpointC)
            {
                return verdict;
            }

            if (elapsed > stability.TimeoutSeconds)
            {
                var why = verdict.IsStable
                    ? $"the reference settled at {F(verdict.Mean!.Value)} °C, more than {F(stability.MaxOffsetFromSetpointC)} °C from the setpoint"
                    : verdict.Why;
                throw new BatchFaultException(
                    $"the source did not become stable at '{setpoint.Name}' ({F(setpoint.Celsius)} °C) within {F(stability.TimeoutSeconds)} s ({why})");
            }
        }
    }

    /// <summary>
    /// Baseline settle: wait the schedule's fixed time from commanding, check the reference once (a fixed wait that
    /// ends off the setpoint is a fault, never a measurement), then soak for the fixed time.
    /// </summary>
    private static async Task SettleFixedAsync(StepContext context, SetpointDefinition setpoint, DateTimeOffset commanded, CancellationToken ct)
    {
        var instruments = context.Instruments;
        var batch = context.Batch;
        var schedule = batch.Request.Schedule;
        var stability = batch.Request.Sequence.Stability;
        var left = schedule.FixedSettleSeconds - (instruments.Now - commanded).TotalSeconds - instruments.Timing.ReferenceReadSeconds;
        await instruments.DelayAsync(left, ct).ConfigureAwait(false);
        var celsius = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
        if (Math.Abs(celsius - setpoint.Celsius) > stability.MaxOffsetFromSetpointC)
        {
            throw new BatchFaultException(
                $"after the fixed settle of {F(schedule.FixedSettleSeconds)} s the reference read {F(celsius)} °C, more than {F(stability.MaxOffsetFromSetpointC)} °C from '{setpoint.Name}' ({F(setpoint.Celsius)} °C)");
        }

        var stableAt = instruments.Now;
        var secondsToStable = (stableAt - commanded).TotalSeconds;
        RuntimeLog.SourceStable(context.Logger, setpoint.Name, setpoint.Celsius, celsius, secondsToStable);
        context.Observer.SourceChanged(setpoint.Celsius, celsius, "stable");
        SourceStable(context);
        await instruments.DelayAsync(schedule.FixedSoakSeconds, ct).ConfigureAwait(false);
        Record(batch, new SetpointRecord(setpoint.Name, setpoint.Celsius, celsius, secondsToStable, schedule.FixedSoakSeconds, stableAt));
    }

    private static void SourceStable(StepContext context)
    {
        foreach (var unit in context.Batch.Active)
        {
            unit.Machine.SourceStable();
            context.Notify(unit);
        }
    }

    private static void Record(BatchState batch, SetpointRecord record)
    {
        batch.SetpointHistory.Add(record);
        foreach (var unit in batch.Active)
        {
            unit.Setpoints.Add(record);
        }
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
