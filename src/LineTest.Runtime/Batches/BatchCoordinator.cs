using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Rig.Instruments;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Logging;
using LineTest.Runtime.Steps;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Runs one batch: the units loaded in a fixture go through the sequence together, because they share one
/// temperature source. The coordinator owns the batch loop and each unit's lifecycle (load, cancel, reject, finish
/// and store); each step kind runs in its executor (<c>Steps/</c>, one per kind, registered in
/// <see cref="StepExecutors"/>), which reaches the instruments only through the <see cref="InstrumentGateway"/>. A unit that fails or errors drops out without stopping the others; a lost
/// source, reference or meter, a source that never settles, a cancel or a failed result write stops the batch and
/// sends the source to standby. Every run is handed to the <see cref="IRunSink"/> the moment it ends.
/// </summary>
/// <remarks>
/// One logical flow of control: the coordinator awaits one thing at a time, so the unit state machines (Stateless,
/// not thread-safe) are only touched here, and the simulator's virtual clock can jump from wait to wait.
/// </remarks>
public sealed class BatchCoordinator : IUnitLifecycle
{
    private readonly InstrumentGateway _instruments;
    private readonly FixtureDefinition _fixture;
    private readonly TimeProvider _time;
    private readonly IRunSink _sink;
    private readonly IOperatorChannel _operator;
    private readonly IBatchObserver _observer;
    private readonly ILogger _logger;
    private readonly IPartFitting? _partFitting;
    private readonly RunJournalWriter _journal;

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
        _fixture = fixture;
        _time = time;
        _instruments = new InstrumentGateway(rig, fixture, referenceToCelsius, time, timing ?? new InstrumentTiming());
        _sink = sink;
        _operator = operatorChannel;
        _observer = observer ?? NullBatchObserver.Instance;
        _logger = logger;
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
            var context = new StepContext(batch, _instruments, this, _operator, _observer, _partFitting, _logger);
            var steps = await BatchPlanner.PlanAsync(context, cancellationToken).ConfigureAwait(false);
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
                await StepExecutors.Of(steps[i]).RunAsync(context, steps[i], cancellationToken).ConfigureAwait(false);
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
            await _instruments.GoToStandbyAsync(timeout.Token).ConfigureAwait(false);
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

    /// <inheritdoc />
    void IUnitLifecycle.Notify(BatchState batch, UnitContext unit) => Notify(batch, unit);

    /// <inheritdoc />
    Task IUnitLifecycle.FinishAsync(BatchState batch, UnitContext unit) => FinishAsync(batch, unit);

    private async Task FinishAsync(BatchState batch, UnitContext unit)
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
}
