using System.Globalization;
using LineTest.Core.Scanning;
using LineTest.Runtime.Batches;
using LineTest.Station.Composition;
using LineTest.Storage.History;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>
/// The operator dialogue as a small state machine (<see cref="DialogueState"/>): every line typed or code scanned is
/// taken in the state the station is in and answered at once — loaded, refused with why, confirmed, or told what is
/// allowed now. It decides; the shift (<see cref="StationShift"/>) runs batches and cancels what it is told to.
/// Used from one loop only.
/// </summary>
public sealed partial class OperatorDialogue
{
    private readonly StationTalk _talk;
    private readonly ScanRules _rules;
    private readonly SerialHistoryReader _history;
    private readonly TimeProvider _clock;
    private readonly IReadOnlyList<int> _slots;
    private readonly bool _production;
    private readonly SlotServiceLog _slotLog;
    private readonly ILogger _logger;
    private readonly List<SlotLoad> _loads = [];
    private readonly Dictionary<int, string> _outOfService = [];
    private readonly HashSet<int> _batchSlots = [];
    private bool _boardShowsVerdicts;

    /// <summary>Creates the dialogue; call <see cref="Begin"/> before the first input.</summary>
    public OperatorDialogue(
        StationTalk talk, ScanRules rules, SerialHistoryReader history, TimeProvider clock, IEnumerable<int> slots, string mode,
        string? operatorName, string? lot, SlotServiceLog slotLog, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(slots);
        _talk = talk;
        _rules = rules;
        _history = history;
        _clock = clock;
        _slots = [.. slots.Order()];
        _production = mode == ProductionGate.Production;
        _slotLog = slotLog;
        _logger = logger;
        Operator = string.IsNullOrWhiteSpace(operatorName) ? null : operatorName.Trim();
        Lot = string.IsNullOrWhiteSpace(lot) ? null : lot.Trim();
    }

    /// <summary>The current state.</summary>
    public DialogueState State { get; private set; } = DialogueState.Loading;

    /// <summary>The operator (badge), once known.</summary>
    public string? Operator { get; private set; }

    /// <summary>The lot, once known.</summary>
    public string? Lot { get; private set; }

    /// <summary>The units scanned for the next batch.</summary>
    public IReadOnlyList<SlotLoad> Loads => _loads;

    /// <summary>The slot a <see cref="DialogueAction.CancelSlot"/> is for.</summary>
    public int SlotToCancel { get; private set; }

    /// <summary>Slots out of service and why.</summary>
    public IReadOnlyDictionary<int, string> OutOfService => _outOfService;

    /// <summary>Starts the dialogue: in production the badge and the lot come first.</summary>
    public void Begin()
    {
        if (_production && Operator is null)
        {
            EnterBadge();
        }
        else if (_production && Lot is null)
        {
            EnterLot();
        }
        else
        {
            EnterLoading();
        }
    }

    /// <summary>Takes one input and answers it.</summary>
    public async Task<DialogueAction> TakeAsync(OperatorEntry entry, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(entry);
        if (entry.Kind == OperatorEntryKind.ScannerNotice)
        {
            _talk.Tell(entry.Text!);
            return DialogueAction.None;
        }

        if (entry.Kind == OperatorEntryKind.Scanned && entry.Scan!.Serial is null)
        {
            _talk.Tell($"Refused: {entry.Scan.Problem}.");
            return DialogueAction.None;
        }

        var scanned = entry.Kind == OperatorEntryKind.Scanned;
        var text = (scanned ? entry.Scan!.Serial! : entry.Text!).Trim();
        _talk.Model.Info([]);
        if (!scanned && TryHistory(text, out var serial))
        {
            await ShowHistoryAsync(serial, ct).ConfigureAwait(false);
            return DialogueAction.None;
        }

        return State switch
        {
            DialogueState.Badge => TakeBadge(text),
            DialogueState.Lot => TakeLot(text),
            DialogueState.Loading => await TakeLoadingAsync(text, scanned, ct).ConfigureAwait(false),
            DialogueState.Running => TakeRunning(text, scanned),
            DialogueState.ConfirmBatchCancel => TakeConfirmBatch(text),
            DialogueState.ConfirmSlotCancel => TakeConfirmSlot(text),
            DialogueState.ConfirmStop => TakeConfirmStop(text),
            _ => Answer("The station is stopping; nothing more is taken."),
        };
    }

    /// <summary>Ctrl-C: during a batch, asks first; otherwise (or when asked already) stops.</summary>
    public DialogueAction Interrupt()
    {
        if (State is DialogueState.Running or DialogueState.ConfirmBatchCancel or DialogueState.ConfirmSlotCancel)
        {
            State = DialogueState.ConfirmStop;
            _talk.Say("Stop the station? The batch is cancelled (its runs stored as error) and the block goes to standby. Type 'yes' to stop, anything else to carry on.");
            return DialogueAction.None;
        }

        State = DialogueState.Stopping;
        return DialogueAction.Stop;
    }

    /// <summary>The batch of <see cref="Loads"/> has started.</summary>
    public void BatchStarted()
    {
        _batchSlots.Clear();
        _batchSlots.UnionWith(_loads.Select(l => l.Slot));
        State = DialogueState.Running;
        _talk.Model.Notice(null);
        _talk.Say($"Batch of {_loads.Count} started. Keep clear of the block while it runs. Type 'cancel' or 'cancel N' to stop.");
    }

    /// <summary>The batch has ended; the board keeps the verdicts until the next input.</summary>
    public void BatchEnded(string summary)
    {
        _batchSlots.Clear();
        _loads.Clear();
        if (State != DialogueState.Stopping)
        {
            State = DialogueState.Loading;
        }

        _boardShowsVerdicts = !_talk.IsPlain;
        if (!_boardShowsVerdicts)
        {
            _talk.Model.UnloadAll();
        }

        _talk.Say(summary);
    }

    private DialogueAction TakeRunning(string text, bool scanned)
    {
        var lower = text.ToLowerInvariant();
        if (lower == "cancel")
        {
            State = DialogueState.ConfirmBatchCancel;
            _talk.Say("Cancel the whole batch? Type 'yes' to confirm, anything else to carry on.");
            return DialogueAction.None;
        }

        if (lower.StartsWith("cancel ", StringComparison.Ordinal))
        {
            if (!int.TryParse(lower[7..].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var slot) || !_slots.Contains(slot))
            {
                return Answer($"Refused: '{text[7..].Trim()}' is not a slot of this fixture (slots {SlotList()}).");
            }

            if (!IsRunning(slot))
            {
                return Answer(_loads.Any(l => l.Slot == slot)
                    ? $"Refused: slot {slot} has already finished; nothing to cancel."
                    : $"Refused: slot {slot} is empty in this batch; nothing to cancel.");
            }

            SlotToCancel = slot;
            State = DialogueState.ConfirmSlotCancel;
            _talk.Say($"Cancel slot {slot}? Type 'yes' to confirm, anything else to carry on.");
            return DialogueAction.None;
        }

        if (scanned || _rules.Check(text, [], SerialHistory.None).Accepted)
        {
            return Answer($"Refused: {text} was scanned while a batch runs; scan it again when the batch is done.");
        }

        return Answer(text.Length == 0
            ? "The batch is running; nothing to start. Now: cancel, cancel N, history SERIAL."
            : $"Not understood: '{text}'. While the batch runs: cancel, cancel N, history SERIAL.");
    }

    private DialogueAction TakeConfirmBatch(string text)
    {
        State = DialogueState.Running;
        if (IsYes(text))
        {
            _talk.Say("Cancelling the batch; the block goes to standby.");
            return DialogueAction.CancelBatch;
        }

        _talk.Say("Not cancelled; the batch carries on.");
        return DialogueAction.None;
    }

    private DialogueAction TakeConfirmSlot(string text)
    {
        State = DialogueState.Running;
        if (!IsYes(text))
        {
            _talk.Say("Not cancelled; the batch carries on.");
            return DialogueAction.None;
        }

        if (!IsRunning(SlotToCancel))
        {
            _talk.Say($"Slot {SlotToCancel} finished meanwhile; nothing was cancelled.");
            return DialogueAction.None;
        }

        _talk.Say($"Cancelling slot {SlotToCancel}; the other slots carry on.");
        return DialogueAction.CancelSlot;
    }

    private DialogueAction TakeConfirmStop(string text)
    {
        if (IsYes(text))
        {
            State = DialogueState.Stopping;
            _talk.Say("Stopping: the batch is cancelled and the block goes to standby.");
            return DialogueAction.Stop;
        }

        State = DialogueState.Running;
        _talk.Say("Not stopped; the batch carries on.");
        return DialogueAction.None;
    }

    // A slot of the running batch whose run has not ended (the screen model is fed by the coordinator's thread).
    private bool IsRunning(int slot) => _batchSlots.Contains(slot) && _talk.Model.Snapshot().Slots.Any(s => s.Slot == slot && s.Verdict is null);

    private static bool IsYes(string text) => text.Equals("yes", StringComparison.OrdinalIgnoreCase);

    private DialogueAction Answer(string text)
    {
        _talk.Tell(text);
        return DialogueAction.None;
    }

    private string SlotList() => string.Join(", ", _slots);

    private static bool TryHistory(string text, out string serial)
    {
        serial = string.Empty;
        if (!text.StartsWith("history", StringComparison.OrdinalIgnoreCase))
        {
            return false;
        }

        serial = text[7..].Trim();
        return text.Length == 7 || char.IsWhiteSpace(text[7]);
    }

    private async Task ShowHistoryAsync(string serial, CancellationToken ct)
    {
        if (serial.Length == 0)
        {
            _talk.Tell("Type 'history' and the serial, e.g. 'history " + (_rules.Example ?? "SERIAL") + "'.");
            return;
        }

        var runs = await _history.ReadAsync(serial, ct).ConfigureAwait(false);
        _talk.Show(Screen.HistoryLines.ForScreen(serial, runs));
    }

    [LoggerMessage(EventId = 2001, Level = LogLevel.Information, Message = "Scanned {Serial} into slot {Slot} (retest: {IsRetest}, from the {ScanSource})")]
    private static partial void LogScanned(ILogger logger, string serial, int slot, bool isRetest, string scanSource);

    [LoggerMessage(EventId = 2020, Level = LogLevel.Information, Message = "Operator {Operator} at the station")]
    private static partial void LogOperator(ILogger logger, string @operator);

    [LoggerMessage(EventId = 2021, Level = LogLevel.Information, Message = "Lot {Lot} set by {Operator}")]
    private static partial void LogLot(ILogger logger, string lot, string? @operator);
}
