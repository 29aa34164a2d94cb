using System.Runtime.InteropServices;
using LineTest.Core.Results;
using LineTest.Runtime.Batches;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// One loop over everything that happens at the station, in order: what the operator types or scans (taken by the
/// <see cref="OperatorDialogue"/>), the running batch ending, and Ctrl-C or SIGTERM. Nothing is read while another
/// thing is handled and no pending read is ever abandoned, so no scan is lost between batches.
/// </summary>
public sealed partial class StationShift
{
    private readonly OperatorDialogue _dialogue;
    private readonly StationTalk _talk;
    private readonly OperatorInput _input;
    private readonly BatchCoordinator _coordinator;
    private readonly StationRig _rig;
    private readonly PromptAnswers _prompts;
    private readonly StopSignals? _signals;
    private readonly BatchRequest _template;
    private readonly ILogger _logger;
    private Task<BatchOutcome>? _batch;
    private CancellationTokenSource? _batchCancel;
    private ShiftEnd? _ending;

    /// <summary>Creates the shift; <paramref name="template"/> holds the sequence, station and mode of every batch.</summary>
    public StationShift(
        OperatorDialogue dialogue, StationTalk talk, OperatorInput input, BatchCoordinator coordinator, StationRig rig,
        PromptAnswers prompts, StopSignals? signals, BatchRequest template, ILogger logger)
    {
        _dialogue = dialogue;
        _talk = talk;
        _input = input;
        _coordinator = coordinator;
        _rig = rig;
        _prompts = prompts;
        _signals = signals;
        _template = template;
        _logger = logger;
    }

    /// <summary>True on a terminal: Ctrl-C during a batch asks before stopping (plain output: it stops at once).</summary>
    public bool AskBeforeStop { get; init; }

    /// <summary>Runs until <c>quit</c>, the end of input, or a stop; a batch in progress is ended (stored) first.</summary>
    /// <exception cref="RunStorageException">A run could not be stored.</exception>
    public async Task<ShiftEnd> RunAsync(CancellationToken ct)
    {
        try
        {
            return await LoopAsync(ct).ConfigureAwait(false);
        }
        catch when (_batch is { IsCompleted: false })
        {
            // Whatever failed, the batch must end before its runs can be stored as error by the caller.
            await _batchCancel!.CancelAsync().ConfigureAwait(false);
            try
            {
                await _batch.ConfigureAwait(false);
            }
            catch (Exception inner) when (inner is not OutOfMemoryException)
            {
                LogBatchEndFailed(_logger, inner.Message);
            }

            throw;
        }
    }

    private async Task<ShiftEnd> LoopAsync(CancellationToken ct)
    {
        _dialogue.Begin();
        Task<OperatorEntry?>? read = null;
        var inputEnded = false;
        Task<PosixSignal>? signal = _signals?.ReadAsync(CancellationToken.None);
        var stopping = Task.Delay(Timeout.Infinite, ct);
        while (true)
        {
            if (!inputEnded)
            {
                // Never cancelled: an abandoned read could swallow the next scan.
                read ??= _input.ReadAsync(CancellationToken.None);
            }

            var waits = new List<Task> { stopping };
            AddIf(waits, read);
            AddIf(waits, _batch);
            AddIf(waits, signal);
            var done = await Task.WhenAny(waits).ConfigureAwait(false);
            if (done == _batch)
            {
                await EndBatchAsync().ConfigureAwait(false);
                if (_ending is { } end)
                {
                    return end;
                }

                if (inputEnded)
                {
                    return ShiftEnd.Done;
                }
            }
            else if (done == signal)
            {
                var received = await signal.ConfigureAwait(false);
                signal = _signals!.ReadAsync(CancellationToken.None);
                var action = received == PosixSignal.SIGTERM || !AskBeforeStop ? DialogueAction.Stop : _dialogue.Interrupt();
                if (await ActAsync(action, received == PosixSignal.SIGTERM ? ShiftEnd.Terminated : ShiftEnd.Interrupted, ct).ConfigureAwait(false) is { } end)
                {
                    return end;
                }
            }
            else if (done == stopping)
            {
                stopping = Task.Delay(Timeout.Infinite, CancellationToken.None);
                if (await ActAsync(DialogueAction.Stop, ShiftEnd.Done, ct).ConfigureAwait(false) is { } end)
                {
                    return end;
                }
            }
            else if (done == read)
            {
                var entry = await read!.ConfigureAwait(false);
                read = null;
                if (entry is null)
                {
                    inputEnded = true;
                    if (_batch is null)
                    {
                        return _ending ?? ShiftEnd.Done;
                    }

                    continue;
                }

                if (entry.Kind == OperatorEntryKind.Typed && _prompts.IsWaiting && _dialogue.State == DialogueState.Running && _prompts.TryAnswer(entry.Text!))
                {
                    continue;
                }

                var action = await _dialogue.TakeAsync(entry, ct).ConfigureAwait(false);
                if (await ActAsync(action, ShiftEnd.Interrupted, ct).ConfigureAwait(false) is { } end)
                {
                    return end;
                }
            }
        }
    }

    // Does what the dialogue decided; returns how the shift ends when it ends now.
    private async Task<ShiftEnd?> ActAsync(DialogueAction action, ShiftEnd stopAs, CancellationToken ct)
    {
        switch (action)
        {
            case DialogueAction.StartBatch:
                StartBatch(ct);
                return null;
            case DialogueAction.CancelBatch:
                await _batchCancel!.CancelAsync().ConfigureAwait(false);
                return null;
            case DialogueAction.CancelSlot:
                _coordinator.RequestSlotCancel(_dialogue.SlotToCancel, "cancelled by the operator");
                return null;
            case DialogueAction.Stop:
                _ending ??= stopAs;
                LogStopping(_logger, _ending.Value.ToString());
                if (_batch is null)
                {
                    return _ending;
                }

                _talk.Say("Stopping: the batch is cancelled (runs stored as error) and the block goes to standby.");
                await _batchCancel!.CancelAsync().ConfigureAwait(false);
                return null;
            case DialogueAction.Quit:
                return ShiftEnd.Done;
            default:
                return null;
        }
    }

    private void StartBatch(CancellationToken ct)
    {
        var loads = _dialogue.Loads.ToList();
        foreach (var load in loads)
        {
            _rig.Loaded(load.Slot, load.Serial);
        }

        _talk.Model.Header = _talk.Model.Header with { Operator = _dialogue.Operator, Lot = _dialogue.Lot };
        _batchCancel?.Dispose();
        _batchCancel = CancellationTokenSource.CreateLinkedTokenSource(ct);
        var request = _template with { Loads = loads, Operator = _dialogue.Operator, Lot = _dialogue.Lot };
        _dialogue.BatchStarted();
        _batch = Task.Run(() => _coordinator.RunAsync(request, _batchCancel.Token), CancellationToken.None);
    }

    private async Task EndBatchAsync()
    {
        var batch = _batch!;
        _batch = null;
        BatchOutcome outcome;
        try
        {
            outcome = await batch.ConfigureAwait(false);
        }
        catch (RunStorageException ex)
        {
            _talk.Model.Alarm($"RESULTS CANNOT BE STORED: {ex.Message}. No new units are taken; call the test engineer.");
            throw;
        }

        foreach (var run in outcome.Runs)
        {
            _rig.Unloaded(run.Slot);
            _talk.Log($"slot {run.Slot} {run.Verdict.ToWord().ToUpperInvariant()}{(run.Disposition is { } place ? " → " + place : string.Empty)}");
        }

        var pass = outcome.Runs.Count(r => r.Verdict == Verdict.Pass);
        var fail = outcome.Runs.Count(r => r.Verdict == Verdict.Fail);
        var error = outcome.Runs.Count(r => r.Verdict == Verdict.Error);
        var sort = outcome.Runs.Any(r => r.Disposition is not null)
            ? "Put each unit where its slot line says"
            : "Unload and sort the units";
        _dialogue.BatchEnded(_ending is null
            ? $"Batch done: {pass} pass, {fail} fail, {error} error. {sort} (inserts may be hot or cold), then scan the next."
            : $"Batch stopped: {pass} pass, {fail} fail, {error} error. {sort} once the block is safe to touch.");
    }

    private static void AddIf(List<Task> waits, Task? task)
    {
        if (task is not null)
        {
            waits.Add(task);
        }
    }

    [LoggerMessage(EventId = 2024, Level = LogLevel.Warning, Message = "The station is stopping ({How})")]
    private static partial void LogStopping(ILogger logger, string how);

    [LoggerMessage(EventId = 2025, Level = LogLevel.Error, Message = "The batch did not end cleanly while the station stopped: {Reason}")]
    private static partial void LogBatchEndFailed(ILogger logger, string reason);
}
