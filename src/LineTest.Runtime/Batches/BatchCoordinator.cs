using System.Globalization;
using LineTest.Core.Decisions;
using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Core.Stability;
using LineTest.Rig.Instruments;
using LineTest.Runtime.Judging;
using LineTest.Runtime.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Runs one batch: the units loaded in a fixture go through the sequence together, because they share one
/// temperature source. Settle steps are batch-wide; other steps run unit by unit (measurements interleave the
/// reference with every unit in rounds). A unit that fails or errors drops out without stopping the others; a lost
/// source, reference or meter, a source that never settles, a cancel or a failed result write stops the batch and
/// sends the source to standby. Every run is handed to the <see cref="IRunSink"/> the moment it ends.
/// </summary>
/// <remarks>
/// One logical flow of control: the coordinator awaits one thing at a time, so the unit state machines (Stateless,
/// not thread-safe) are only touched here, and the simulator's virtual clock can jump from wait to wait.
/// </remarks>
public sealed partial class BatchCoordinator
{
    private readonly RigInstruments _rig;
    private readonly FixtureDefinition _fixture;
    private readonly Func<double, double> _referenceToCelsius;
    private readonly TimeProvider _time;
    private readonly IRunSink _sink;
    private readonly IOperatorChannel _operator;
    private readonly IBatchObserver _observer;
    private readonly ILogger _logger;
    private readonly InstrumentTiming _timing;
    private readonly IPartFitting? _partFitting;
    private readonly RunJournalWriter _journal;
    private double _lastReferenceRaw = double.NaN;

    // Written by the operator screen's thread, read by the coordinator's loop at step boundaries.
    private readonly System.Collections.Concurrent.ConcurrentDictionary<int, string> _slotCancels = new();

    /// <summary>Creates a coordinator for one fixture's instruments.</summary>
    /// <param name="rig">The fixture's instruments.</param>
    /// <param name="fixture">The fixture definition (wiring, safe range, standby).</param>
    /// <param name="referenceToCelsius">Converts the reference readout's raw value to °C; returns NaN when it cannot.</param>
    /// <param name="time">Clock for every wait (virtual in the simulator).</param>
    /// <param name="sink">Stores each run the moment it ends.</param>
    /// <param name="operatorChannel">Shows prompts.</param>
    /// <param name="observer">Live progress, or null.</param>
    /// <param name="logger">Logger.</param>
    /// <param name="timing">Instrument pacing, or null for defaults.</param>
    /// <param name="partFitting">
    /// Where select-on-test parts go once the operator confirms fitting them (the simulator fits them into its units);
    /// null on a real station, where the run's record of the confirmation is all there is.
    /// </param>
    public BatchCoordinator(
        RigInstruments rig,
        FixtureDefinition fixture,
        Func<double, double> referenceToCelsius,
        TimeProvider time,
        IRunSink sink,
        IOperatorChannel operatorChannel,
        IBatchObserver? observer,
        ILogger logger,
        InstrumentTiming? timing = null,
        IPartFitting? partFitting = null)
    {
        ArgumentNullException.ThrowIfNull(rig);
        ArgumentNullException.ThrowIfNull(fixture);
        ArgumentNullException.ThrowIfNull(referenceToCelsius);
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(sink);
        ArgumentNullException.ThrowIfNull(operatorChannel);
        ArgumentNullException.ThrowIfNull(logger);
        _rig = rig;
        _fixture = fixture;
        _referenceToCelsius = referenceToCelsius;
        _time = time;
        _sink = sink;
        _operator = operatorChannel;
        _observer = observer ?? NullBatchObserver.Instance;
        _logger = logger;
        _timing = timing ?? new InstrumentTiming();
        _partFitting = partFitting;
        _journal = new RunJournalWriter(sink as IRunJournal, fixture.Id, time, logger);
    }

    /// <summary>Runs the batch to its end. Throws <see cref="RunStorageException"/> when a run could not be stored.</summary>
    public async Task<BatchOutcome> RunAsync(BatchRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var batch = new BatchState(request, _time.GetUtcNow());
        _slotCancels.Clear();
        foreach (var load in request.Loads)
        {
            if (_fixture.Slots.All(s => s.Slot != load.Slot))
            {
                throw new ArgumentException($"Slot {load.Slot} does not exist in fixture '{_fixture.Id}'.", nameof(request));
            }

            var unit = new UnitContext(load, batch.Started);
            foreach (var register in RegistersOf(request.Sequence))
            {
                unit.Registers[register.Name] = register.Nominal;
            }

            if (_logger.IsEnabled(LogLevel.Debug))
            {
                // Only when Debug is on: the enum names are formatted before the logger could skip the message.
                unit.Machine.Transitioned += (from, to, trigger) =>
                    RuntimeLog.Transition(_logger, unit.Serial, unit.Slot, from.ToString(), to.ToString(), trigger.ToString());
            }

            batch.Units.Add(unit);
            Notify(batch, unit);
        }

        RuntimeLog.BatchStarted(_logger, batch.Id, batch.Units.Count, request.Sequence.Id, request.Sequence.Revision);
        string? aborted = null;
        try
        {
            await _journal.WriteAsync(batch).ConfigureAwait(false);
            var steps = await PlanStepsAsync(batch, cancellationToken).ConfigureAwait(false);
            for (var i = 0; i < steps.Count; i++)
            {
                cancellationToken.ThrowIfCancellationRequested();
                if (batch.Active.Count == 0)
                {
                    break;
                }

                foreach (var unit in batch.Active)
                {
                    unit.StepIndex = i;
                    unit.CurrentStep = steps[i].DisplayName;
                }

                await EndCancelledSlotsAsync(batch).ConfigureAwait(false);
                await RunStepAsync(batch, steps[i], cancellationToken).ConfigureAwait(false);
                await EndRejectedAsync(batch).ConfigureAwait(false);
                await EndCancelledSlotsAsync(batch).ConfigureAwait(false);
                await _journal.WriteAsync(batch).ConfigureAwait(false);
            }

            foreach (var unit in batch.Active)
            {
                if (unit.FirstFailingReading is not null)
                {
                    unit.Machine.Reject(unit.FirstFailureReason ?? unit.FirstFailingReading);
                }
                else
                {
                    unit.Machine.Complete();
                }

                await FinishAsync(batch, unit).ConfigureAwait(false);
            }
        }
        catch (OperationCanceledException) when (cancellationToken.IsCancellationRequested)
        {
            aborted = "cancelled";
            await EndAllAsync(batch, u => u.Machine.Cancel("cancelled before the test was complete")).ConfigureAwait(false);
        }
        catch (BatchFaultException ex)
        {
            aborted = ex.Message;
            await EndAllAsync(batch, u => u.Machine.Fault(ex.Message)).ConfigureAwait(false);
        }
        catch (RunStorageException ex)
        {
            aborted = ex.Message;
            RuntimeLog.BatchAborted(_logger, batch.Id, ex.Message);
            await StandbyAsync(ex.Message).ConfigureAwait(false);
            throw;
        }

        if (aborted is not null)
        {
            RuntimeLog.BatchAborted(_logger, batch.Id, aborted);
            await StandbyAsync(aborted).ConfigureAwait(false);
        }

        var runs = batch.Units.Select(u => u.Record!).ToList();
        return new BatchOutcome(batch.Id, runs, batch.SetpointHistory, batch.Started, _time.GetUtcNow(), aborted);
    }

    /// <summary>
    /// Asks for one slot's run to be cancelled (verdict error with <paramref name="reason"/>) at the next step
    /// boundary; the other units carry on. Safe to call from any thread.
    /// </summary>
    public void RequestSlotCancel(int slot, string reason) => _slotCancels[slot] = reason;

    /// <summary>Sends the source to standby, logging (never throwing) if that fails.</summary>
    public async Task StandbyAsync(string why)
    {
        try
        {
            using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(30));
            await _rig.Source.GoToStandbyAsync(timeout.Token).ConfigureAwait(false);
            RuntimeLog.Standby(_logger, _fixture.Source.StandbyC, why);
            _observer.SourceChanged(_fixture.Source.StandbyC, null, "standby");
        }
        catch (Exception ex) when (ex is InstrumentFaultException or OperationCanceledException or IOException or TimeoutException)
        {
            RuntimeLog.StandbyFailed(_logger, ex.Message);
        }
    }

    private static IEnumerable<(string Name, long Nominal)> RegistersOf(SequenceDefinition sequence)
    {
        if (sequence.Trim?.Dac is { } dac)
        {
            yield return (dac.Gain.Register, dac.Gain.Nominal);
            yield return (dac.Offset.Register, dac.Offset.Nominal);
        }
    }

    private async Task RunStepAsync(BatchState batch, StepDefinition step, CancellationToken ct)
    {
        switch (step)
        {
            case SettleStep settle:
                await SettleAsync(batch, settle, ct).ConfigureAwait(false);
                break;
            case MeasureStep measure:
                await MeasureAsync(batch, measure, ct).ConfigureAwait(false);
                break;
            case VerifyStep verify:
                await VerifyAsync(batch, verify, ct).ConfigureAwait(false);
                break;
            case PromptStep prompt:
                foreach (var unit in batch.Active)
                {
                    unit.Machine.BeginPrompt();
                    Notify(batch, unit);
                }

                await _operator.PromptAsync(prompt.Text, prompt.Confirm, ct).ConfigureAwait(false);
                break;
            default:
                foreach (var unit in batch.Active)
                {
                    try
                    {
                        await RunUnitStepAsync(batch, unit, step, ct).ConfigureAwait(false);
                    }
                    catch (UnitFaultException ex)
                    {
                        RuntimeLog.UnitFault(_logger, unit.Serial, unit.Slot, ex.Message);
                        unit.Machine.Fault(ex.Message);
                        await FinishAsync(batch, unit).ConfigureAwait(false);
                    }
                }

                break;
        }
    }

    private async Task RunUnitStepAsync(BatchState batch, UnitContext unit, StepDefinition step, CancellationToken ct)
    {
        switch (step)
        {
            case IdentifyStep:
                unit.Machine.BeginIdentify();
                Notify(batch, unit);
                await IdentifyAsync(batch, unit, ct).ConfigureAwait(false);
                break;
            case SupplyCurrentStep supply:
                unit.Machine.BeginSupplyCheck();
                Notify(batch, unit);
                await SupplyCurrentAsync(unit, supply, ct).ConfigureAwait(false);
                break;
            case TrimStep trim:
                unit.Machine.BeginTrim();
                Notify(batch, unit);
                var sequence = batch.Request.Sequence;
                var executor = sequence.Trim?.Method switch
                {
                    TrimMethods.Dac => new DacTrimExecutor(this).RunAsync(sequence, trim, unit, ct),
                    TrimMethods.Resistor => new ResistorTrimExecutor(this, batch).RunAsync(sequence, trim, unit, ct),
                    TrimMethods.Firmware => new FirmwareTrimExecutor(this).RunAsync(sequence, trim, unit, ct),
                    var method => throw new InvalidOperationException($"Trim method '{method}' has no executor (the checker accepts only known methods)."),
                };
                await executor.ConfigureAwait(false);
                break;
            case IvSweepStep sweep:
                unit.Machine.BeginMeasure();
                Notify(batch, unit);
                await new IvSweepExecutor(this).RunAsync(batch.Request.Sequence, sweep, unit, ct).ConfigureAwait(false);
                break;
            default:
                throw new InvalidOperationException($"Step kind '{step.Kind}' has no executor.");
        }
    }

    private async Task IdentifyAsync(BatchState batch, UnitContext unit, CancellationToken ct)
    {
        var identity = await LinkAsync(unit, (link, token) => link.IdentifyAsync(token), ct).ConfigureAwait(false);
        unit.Firmware = identity.Firmware;
        if (!string.Equals(identity.Serial, unit.Serial, StringComparison.Ordinal))
        {
            throw new UnitFaultException(
                $"the unit in slot {unit.Slot} reports serial '{identity.Serial}' but '{unit.Serial}' was scanned: check the unit is in the right slot");
        }

        if (!string.Equals(identity.Product, batch.Request.Sequence.Product, StringComparison.Ordinal))
        {
            throw new UnitFaultException(
                $"the unit in slot {unit.Slot} is a '{identity.Product}', but sequence '{batch.Request.Sequence.Id}' tests '{batch.Request.Sequence.Product}'");
        }
    }

    private async Task SupplyCurrentAsync(UnitContext unit, SupplyCurrentStep step, CancellationToken ct)
    {
        var slot = SlotOf(unit);
        var amps = new double[step.Samples];
        for (var i = 0; i < step.Samples; i++)
        {
            var volts = await ReadMeterAsync(slot.SupplyChannel, ct).ConfigureAwait(false);
            amps[i] = volts / slot.SupplyShuntOhms;
        }

        var mean = amps.Average();
        var meanVolts = mean * slot.SupplyShuntOhms;
        var budget = new UncertaintyBudget(
        [
            .. TypeA("repeatability", amps),
            UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(meanVolts), 1 / slot.SupplyShuntOhms),
            UncertaintyComponent.FromResolution("meter resolution", _fixture.Meter.ResolutionVolts, 1 / slot.SupplyShuntOhms),
        ]);
        var unitSymbol = step.Limits.Unit;
        var scale = UnitsOfMeasure.FromBase(1, unitSymbol);
        var u = budget.Expand();
        var reading = ReadingFactory.Create(step.DisplayName, mean * scale, step.Limits,
            new ExpandedUncertainty(u.StandardUncertainty * scale, u.CoverageFactor), step.Samples, _time.GetUtcNow()) with
        { Step = step.DisplayName };
        unit.Add(reading);
    }

    private async Task SettleAsync(BatchState batch, SettleStep step, CancellationToken ct)
    {
        var sequence = batch.Request.Sequence;
        var setpoint = sequence.Setpoints.First(s => s.Name == step.Setpoint);
        foreach (var unit in batch.Active)
        {
            unit.Machine.AwaitSource();
            Notify(batch, unit);
        }

        var commanded = await CommandSetpointAsync(setpoint, ct).ConfigureAwait(false);
        _observer.SourceChanged(setpoint.Celsius, null, "ramping");
        if (batch.Request.Schedule.Kind == BatchScheduleKind.Baseline)
        {
            await SettleFixedAsync(batch, setpoint, commanded, ct).ConfigureAwait(false);
            return;
        }

        var stability = sequence.Stability;
        var window = new StabilityWindow(stability.WindowSeconds, stability.BandC, stability.MaxDriftCPerMinute);
        StabilityVerdict verdict;
        while (true)
        {
            var elapsed = (_time.GetUtcNow() - commanded).TotalSeconds;
            var wait = stability.SampleIntervalSeconds - _timing.ReferenceReadSeconds;
            if (wait > 0)
            {
                await DelayAsync(wait, ct).ConfigureAwait(false);
            }

            var celsius = await ReadReferenceAsync(ct).ConfigureAwait(false);
            elapsed = (_time.GetUtcNow() - commanded).TotalSeconds;
            window.Add(elapsed, celsius);
            verdict = window.Evaluate();
            _observer.SourceChanged(setpoint.Celsius, celsius, "settling");
            if (verdict.IsStable && Math.Abs(verdict.Mean!.Value - setpoint.Celsius) <= stability.MaxOffsetFromSetpointC)
            {
                break;
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

        var stableAt = _time.GetUtcNow();
        var secondsToStable = (stableAt - commanded).TotalSeconds;
        RuntimeLog.SourceStable(_logger, setpoint.Name, setpoint.Celsius, verdict.Mean!.Value, secondsToStable);
        _observer.SourceChanged(setpoint.Celsius, verdict.Mean, "stable");
        foreach (var unit in batch.Active)
        {
            unit.Machine.SourceStable();
            Notify(batch, unit);
        }

        var soakSeconds = await SoakAsync(batch, sequence, ct).ConfigureAwait(false);
        var record = new SetpointRecord(setpoint.Name, setpoint.Celsius, verdict.Mean, secondsToStable, soakSeconds, stableAt);
        batch.SetpointHistory.Add(record);
        foreach (var unit in batch.Active)
        {
            unit.Setpoints.Add(record);
        }
    }

    private async Task<double> SoakAsync(BatchState batch, SequenceDefinition sequence, CancellationToken ct)
    {
        var soak = sequence.Soak;
        var start = _time.GetUtcNow();
        if (soak.MinimumSeconds > 0)
        {
            await DelayAsync(soak.MinimumSeconds, ct).ConfigureAwait(false);
        }

        // Drift is judged in °C: volts from the meter over the output sensitivity, or raw counts from the link over
        // the raw sensitivity (the checker requires outputCountsPerC for a link soak).
        var overLink = soak.Output == UnitOutputs.Link;
        var sensitivity = overLink
            ? Math.Abs(soak.OutputCountsPerC ?? throw new InvalidOperationException("Checked sequences soaking over the link give outputCountsPerC."))
            : Math.Abs(soak.OutputVoltsPerC ?? sequence.Trim?.AnalogTarget?.SlopeVoltsPerC ?? 0.01);
        var windows = batch.Active.ToDictionary(
            u => u,
            _ => new StabilityWindow(soak.WindowSeconds, double.PositiveInfinity, soak.MaxDriftCPerMinute));
        while (windows.Count > 0)
        {
            var elapsed = (_time.GetUtcNow() - start).TotalSeconds;
            if (elapsed > soak.TimeoutSeconds)
            {
                foreach (var (unit, window) in windows)
                {
                    var drift = window.Evaluate().DriftPerMinute;
                    var reason = $"the unit in slot {unit.Slot} did not follow the block within {F(soak.TimeoutSeconds)} s"
                        + (drift is { } d ? $" (still drifting {F(d)} °C/min)" : string.Empty) + ": check the unit is seated in its well";
                    RuntimeLog.UnitFault(_logger, unit.Serial, unit.Slot, reason);
                    unit.Machine.Fault(reason);
                    await FinishAsync(batch, unit).ConfigureAwait(false);
                }

                break;
            }

            var roundStart = _time.GetUtcNow();
            foreach (var (unit, window) in windows.ToList())
            {
                if (unit.IsFinished)
                {
                    windows.Remove(unit);
                    continue;
                }

                double output;
                try
                {
                    output = await ReadUnitAsync(unit, overLink ? UnitRead.Raw : UnitRead.MeterVolts, ct).ConfigureAwait(false);
                }
                catch (UnitFaultException ex)
                {
                    windows.Remove(unit);
                    await FaultUnitAsync(batch, unit, ex.Message).ConfigureAwait(false);
                    continue;
                }

                window.Add((_time.GetUtcNow() - start).TotalSeconds, output / sensitivity);
                if (window.Evaluate().IsStable)
                {
                    windows.Remove(unit);
                }
            }

            var spent = (_time.GetUtcNow() - roundStart).TotalSeconds;
            if (windows.Count > 0 && soak.SampleIntervalSeconds > spent)
            {
                await DelayAsync(soak.SampleIntervalSeconds - spent, ct).ConfigureAwait(false);
            }
        }

        return (_time.GetUtcNow() - start).TotalSeconds;
    }

    private async Task MeasureAsync(BatchState batch, MeasureStep step, CancellationToken ct)
    {
        var units = batch.Active;
        foreach (var unit in units)
        {
            unit.Machine.BeginMeasure();
            Notify(batch, unit);
        }

        var overLink = step.Output == UnitOutputs.Link;
        var (references, outputs) = await SampleRoundsAsync(batch, units, overLink ? UnitRead.Raw : UnitRead.MeterVolts, step.Samples, ct)
            .ConfigureAwait(false);
        var refMean = references.Average();
        var refU = ReferenceBudget(references).Expand();
        var now = _time.GetUtcNow();
        foreach (var (unit, samples) in outputs)
        {
            var mean = samples.Average();

            // Raw counts carry their repeatability and the one-count resolution of the unit's ADC; volts the meter's
            // specification and resolution as well (JCGM 100:2008 §4.2, §4.3).
            var u = new UncertaintyBudget(overLink
                ? [.. TypeA("repeatability", samples), UncertaintyComponent.FromResolution("unit resolution", 1)]
                :
                [
                    .. TypeA("repeatability", samples),
                    UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(mean)),
                    UncertaintyComponent.FromResolution("meter resolution", _fixture.Meter.ResolutionVolts),
                ]).Expand();
            unit.CalibrationPoints[step.Setpoint] = (refMean, mean);
            unit.Add(UnlimitedReading.Create($"{step.DisplayName}.reference", refMean, "degC", refU) with
            { Step = step.DisplayName, Setpoint = step.Setpoint, Samples = step.Samples, At = now });
            Reading output;
            if (step.OutputLimits is { } limits)
            {
                var scale = UnitsOfMeasure.FromBase(1, limits.Unit);
                output = ReadingFactory.Create($"{step.DisplayName}.output", mean * scale, limits,
                    new ExpandedUncertainty(u.StandardUncertainty * scale, u.CoverageFactor), step.Samples, now);
            }
            else
            {
                output = UnlimitedReading.Create($"{step.DisplayName}.output", mean, overLink ? "count" : "V", u) with { Samples = step.Samples, At = now };
            }

            unit.Add(output with { Step = step.DisplayName, Setpoint = step.Setpoint });
        }
    }

    private async Task VerifyAsync(BatchState batch, VerifyStep step, CancellationToken ct)
    {
        var units = batch.Active;
        foreach (var unit in units)
        {
            unit.Machine.BeginVerify();
            Notify(batch, unit);
        }

        var overLink = step.Output == UnitOutputs.Link;
        var (references, outputs) = await SampleRoundsAsync(batch, units, overLink ? UnitRead.Temperature : UnitRead.MeterVolts, step.Samples, ct)
            .ConfigureAwait(false);
        var target = batch.Request.Sequence.Trim?.AnalogTarget;
        var slope = target?.SlopeVoltsPerC ?? batch.Request.Sequence.Soak.OutputVoltsPerC ?? 0.01;
        var offset = target?.OffsetVolts ?? 0;
        var referenceBudget = ReferenceBudget(references);
        var now = _time.GetUtcNow();
        foreach (var (unit, values) in outputs)
        {
            // Over the link the unit reports °C itself; from the meter its volts go through the target transfer.
            var errors = new double[values.Length];
            for (var i = 0; i < values.Length; i++)
            {
                errors[i] = (overLink ? values[i] : (values[i] - offset) / slope) - references[i];
            }

            var meanError = errors.Average();
            var meanVolts = values.Average();

            // Error = indicated − reference: the unit's repeatability (Type A of the error samples), the meter's
            // specification and resolution through the sensitivity 1/S (not for a unit that reports °C over its
            // link), and the reference certificate (JCGM 100:2008 §4.2, §4.3, §5.1).
            UncertaintyComponent[] meter = overLink
                ? []
                :
                [
                    UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(meanVolts), 1 / Math.Abs(slope)),
                    UncertaintyComponent.FromResolution("meter resolution", _fixture.Meter.ResolutionVolts, 1 / Math.Abs(slope)),
                ];
            var u = new UncertaintyBudget(
            [
                .. TypeA("repeatability", errors),
                .. meter,
                .. referenceBudget.Components.Where(c => c.Name != "reference repeatability"),
            ]).Expand();
            unit.Add(UnlimitedReading.Create($"{step.DisplayName}.reference", references.Average(), "degC", referenceBudget.Expand()) with
            { Step = step.DisplayName, Setpoint = step.Setpoint, Samples = step.Samples, At = now });
            unit.Add(ReadingFactory.Create(step.DisplayName, meanError, step.Limits, u, step.Samples, now) with
            { Step = step.DisplayName, Setpoint = step.Setpoint });
        }
    }

    /// <summary>
    /// Reads the reference and then every unit's output, <paramref name="samples"/> rounds. A unit whose link fails
    /// ends in error at once and is left out of the result; the others go on.
    /// </summary>
    private async Task<(double[] References, List<(UnitContext Unit, double[] Values)> Outputs)> SampleRoundsAsync(
        BatchState batch, IReadOnlyList<UnitContext> units, UnitRead read, int samples, CancellationToken ct)
    {
        var references = new double[samples];
        var outputs = units.Select(u => (Unit: u, Values: new double[samples])).ToList();
        for (var i = 0; i < samples; i++)
        {
            references[i] = await ReadReferenceAsync(ct).ConfigureAwait(false);
            foreach (var (unit, values) in outputs.ToList())
            {
                try
                {
                    values[i] = await ReadUnitAsync(unit, read, ct).ConfigureAwait(false);
                }
                catch (UnitFaultException ex)
                {
                    outputs.RemoveAll(o => o.Unit == unit);
                    await FaultUnitAsync(batch, unit, ex.Message).ConfigureAwait(false);
                }
            }
        }

        return (references, outputs);
    }

    /// <summary>One reading of a unit's value: meter volts on its output channel, or raw counts or °C over its link.</summary>
    private async Task<double> ReadUnitAsync(UnitContext unit, UnitRead read, CancellationToken ct)
    {
        switch (read)
        {
            case UnitRead.Raw:
                return await LinkAsync(unit, (link, token) => link.ReadRawAsync(token), ct).ConfigureAwait(false);
            case UnitRead.Temperature:
                var celsius = await LinkAsync(unit, (link, token) => link.ReadTemperatureAsync(token), ct).ConfigureAwait(false);
                if (!double.IsFinite(celsius))
                {
                    throw new UnitFaultException($"the unit in slot {unit.Slot} reported a temperature that is not a number");
                }

                return celsius;
            default:
                return await ReadMeterAsync(SlotOf(unit).OutputChannel, ct).ConfigureAwait(false);
        }
    }

    private async Task FaultUnitAsync(BatchState batch, UnitContext unit, string reason)
    {
        RuntimeLog.UnitFault(_logger, unit.Serial, unit.Slot, reason);
        unit.Machine.Fault(reason);
        await FinishAsync(batch, unit).ConfigureAwait(false);
    }

    /// <summary>
    /// Shows a prompt about one unit that needs the operator's confirmation (e.g. which parts to fit); the unit shows
    /// as awaiting the operator until it is confirmed, then returns to its trim.
    /// </summary>
    internal async Task PromptOperatorAsync(BatchState batch, UnitContext unit, string text, CancellationToken ct)
    {
        unit.Machine.BeginPrompt();
        Notify(batch, unit);
        await _operator.PromptAsync(text, confirm: true, ct).ConfigureAwait(false);
        unit.Machine.BeginTrim();
        Notify(batch, unit);
    }

    /// <summary>Reports parts the operator confirmed fitting (nothing to do on a real station).</summary>
    internal Task PartsFittedAsync(UnitContext unit, IReadOnlyList<Core.Trims.ResistorChoice> parts, CancellationToken ct) =>
        _partFitting?.PartsFittedAsync(unit.Slot, unit.Serial, parts, ct) ?? Task.CompletedTask;

    internal async Task<T> LinkAsync<T>(UnitContext unit, Func<IUnitLink, CancellationToken, Task<T>> call, CancellationToken ct)
    {
        if (!_rig.UnitLinks.TryGetValue(unit.Slot, out var link))
        {
            throw new UnitFaultException($"slot {unit.Slot} has no unit link in fixture '{_fixture.Id}'");
        }

        await DelayAsync(_timing.UnitExchangeSeconds, ct).ConfigureAwait(false);
        try
        {
            return await call(link, ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            var what = ex.Kind switch
            {
                InstrumentFaultKind.NoAnswer => "the unit does not answer on its link",
                InstrumentFaultKind.GarbageReply => "the unit's reply could not be understood",
                InstrumentFaultKind.PortLost => "the unit's port was lost",
                InstrumentFaultKind.InstrumentError => "the unit reported an error",
                _ => "the unit link failed",
            };
            throw new UnitFaultException($"{what} (slot {unit.Slot}): {ex.Message}", ex);
        }
    }

    internal Task LinkAsync(UnitContext unit, Func<IUnitLink, CancellationToken, Task> call, CancellationToken ct) =>
        LinkAsync<bool>(unit, async (link, token) =>
        {
            await call(link, token).ConfigureAwait(false);
            return true;
        }, ct);

    internal Task DelayAsync(double seconds, CancellationToken ct) =>
        seconds <= 0 ? Task.CompletedTask : Task.Delay(TimeSpan.FromSeconds(seconds), _time, ct);

    internal double StoreSeconds => _timing.UnitStoreSeconds;

    internal double MeterReadSeconds => _timing.MeterReadSeconds;

    internal FixtureDefinition Fixture => _fixture;

    internal ISourceMeter? SourceMeter => _rig.SourceMeter;

    internal Task<double> ReadReferenceCelsiusAsync(CancellationToken ct) => ReadReferenceAsync(ct);

    internal DateTimeOffset Now => _time.GetUtcNow();

    private async Task<double> ReadReferenceAsync(CancellationToken ct)
    {
        await DelayAsync(_timing.ReferenceReadSeconds, ct).ConfigureAwait(false);
        double raw;
        try
        {
            raw = await _rig.Reference.ReadRawAsync(ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"reference thermometer lost: {ex.Message}", ex);
        }

        _lastReferenceRaw = raw;
        var celsius = _referenceToCelsius(raw);
        if (!double.IsFinite(celsius))
        {
            throw new BatchFaultException(
                $"the reference readout gave {F(raw)}, which is not a temperature the reference sensor can have: check the reference probe and its wiring");
        }

        return celsius;
    }

    private async Task<double> ReadMeterAsync(int channel, CancellationToken ct)
    {
        await DelayAsync(_timing.MeterReadSeconds, ct).ConfigureAwait(false);
        try
        {
            var volts = await _rig.Meter.ReadDcVoltsAsync(channel, ct).ConfigureAwait(false);
            if (!double.IsFinite(volts))
            {
                throw new BatchFaultException($"the meter returned a non-numeric reading on channel {channel}");
            }

            return volts;
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"voltmeter lost: {ex.Message}", ex);
        }
    }

    private async Task SourceAsync(Func<CancellationToken, Task> call, CancellationToken ct)
    {
        try
        {
            await call(ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException ex)
        {
            throw new BatchFaultException($"temperature source lost: {ex.Message}", ex);
        }
    }

    /// <summary>Half-width of the meter's specification for a reading, volts (± % of reading + offset).</summary>
    private double MeterHalfWidthVolts(double volts)
    {
        var meter = _fixture.Meter;
        return meter.AccuracyPercentOfReading / 100.0 * Math.Abs(volts) + meter.AccuracyOffsetVolts;
    }

    /// <summary>Type A of the mean when there are two samples or more; a single sample carries none.</summary>
    private static UncertaintyComponent[] TypeA(string name, double[] samples, double sensitivity = 1.0) =>
        samples.Length < 2 ? [] : [UncertaintyComponent.FromSamples(name, samples, sensitivity)];

    /// <summary>°C per raw unit of the reference at its last reading (numerical derivative of the conversion).</summary>
    private double ReferenceCelsiusPerRaw()
    {
        var h = Math.Max(_fixture.Reference.ReadoutResolution, Math.Abs(_lastReferenceRaw) * 1e-6);
        var slope = (_referenceToCelsius(_lastReferenceRaw + h) - _referenceToCelsius(_lastReferenceRaw - h)) / (2 * h);
        return double.IsFinite(slope) ? slope : 0;
    }

    /// <summary>Reference temperature budget: certificate U/k, readout resolution and repeatability (JCGM 100:2008 §4.2, §4.3).</summary>
    private UncertaintyBudget ReferenceBudget(double[] references)
    {
        var reference = _fixture.Reference;
        return new UncertaintyBudget(
        [
            UncertaintyComponent.FromExpanded("reference certificate", reference.CertificateExpandedUncertaintyC, reference.CertificateCoverageFactor),
            UncertaintyComponent.FromResolution("reference readout resolution", reference.ReadoutResolution, ReferenceCelsiusPerRaw()),
            .. TypeA("reference repeatability", references),
        ]);
    }

    private SlotDefinition SlotOf(UnitContext unit) => _fixture.Slots.First(s => s.Slot == unit.Slot);

    private async Task EndRejectedAsync(BatchState batch)
    {
        if (!batch.Request.Sequence.StopOnFail)
        {
            return;
        }

        foreach (var unit in batch.Active)
        {
            if (unit.FirstFailingReading is not null)
            {
                unit.Machine.Reject(unit.FirstFailureReason ?? unit.FirstFailingReading);
                await FinishAsync(batch, unit).ConfigureAwait(false);
            }
        }
    }

    private async Task EndCancelledSlotsAsync(BatchState batch)
    {
        foreach (var unit in batch.Active)
        {
            if (_slotCancels.TryRemove(unit.Slot, out var reason))
            {
                unit.Machine.Cancel(reason);
                await FinishAsync(batch, unit).ConfigureAwait(false);
            }
        }
    }

    private async Task EndAllAsync(BatchState batch, Action<UnitContext> end)
    {
        foreach (var unit in batch.Active)
        {
            end(unit);
            await FinishAsync(batch, unit).ConfigureAwait(false);
        }
    }

    internal async Task FinishAsync(BatchState batch, UnitContext unit)
    {
        var verdict = unit.Machine.State switch
        {
            Core.Units.UnitState.Passed => Verdict.Pass,
            Core.Units.UnitState.Failed => Verdict.Fail,
            _ => Verdict.Error,
        };

        // The same record the journal keeps while the run is in progress, now with its verdict.
        var record = RunJournalWriter.Snapshot(batch, unit, _fixture.Id, _time.GetUtcNow()) with
        {
            Verdict = verdict,
            Reason = verdict == Verdict.Pass ? null : unit.Machine.Reason,
            Disposition = batch.Request.Sequence.Dispositions?.For(verdict, unit.FirstFailingReading),
        };
        unit.Record = record;
        try
        {
            await _sink.RunEndedAsync(record, CancellationToken.None).ConfigureAwait(false);
        }
        catch (Exception ex) when (ex is not OperationCanceledException)
        {
            RuntimeLog.StoreFailed(_logger, unit.Serial, ex.Message);
            throw new RunStorageException($"the run of {unit.Serial} could not be stored: {ex.Message}", ex);
        }

        RuntimeLog.RunEnded(_logger, record.Serial, record.Slot, verdict.ToWord(), record.Reason is null ? string.Empty : $"({record.Reason}) ", record.Id,
            record.SequenceId, record.SequenceRevision, record.Station, record.BatchId);
        Notify(batch, unit);
        _observer.UnitFinished(record);
    }

    private void Notify(BatchState batch, UnitContext unit) =>
        _observer.UnitChanged(unit.Slot, unit.Serial, unit.Machine.State, unit.CurrentStep, unit.StepIndex, batch.Request.Sequence.Steps.Count);

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
