using System.Globalization;
using LineTest.Core.Scanning;
using LineTest.Runtime.Batches;
using Microsoft.Extensions.Logging;

namespace LineTest.Station.Hosting;

/// <summary>Before a batch: badge, lot, scans into slots, slots out of service.</summary>
public sealed partial class OperatorDialogue
{
    private const string AllowedWhileLoading =
        "Now: scan a serial, 'N SERIAL' for slot N, Enter to start, 'history SERIAL', 'slot N off REASON', 'slot N on', 'lot', 'quit'.";

    private void EnterBadge()
    {
        State = DialogueState.Badge;
        _talk.Say("Production: scan your operator badge.");
    }

    private void EnterLot()
    {
        State = DialogueState.Lot;
        _talk.Say(Lot is null ? "Scan the lot number." : $"Scan the new lot number (now {Lot}), or press Enter to keep it.");
    }

    private void EnterLoading()
    {
        State = DialogueState.Loading;
        PromptScan();
    }

    private DialogueAction TakeBadge(string text)
    {
        if (text.Equals("quit", StringComparison.OrdinalIgnoreCase))
        {
            return DialogueAction.Quit;
        }

        if (text.Length == 0 || LooksLikeSerial(text))
        {
            return Answer(text.Length == 0
                ? "Refused: production needs the operator's badge and the lot before the first batch. Scan your badge."
                : $"Refused: {text} is a unit serial; production needs the operator's badge and the lot before the first batch. Scan your badge.");
        }

        Operator = text;
        _talk.Model.Header = _talk.Model.Header with { Operator = text };
        LogOperator(_logger, text);
        _talk.Tell($"Operator {text}.");
        if (Lot is null)
        {
            EnterLot();
        }
        else
        {
            EnterLoading();
        }

        return DialogueAction.None;
    }

    private DialogueAction TakeLot(string text)
    {
        if (text.Length == 0 && Lot is not null)
        {
            _talk.Tell($"Lot {Lot} kept.");
            EnterLoading();
            return DialogueAction.None;
        }

        if (text.Length == 0 || LooksLikeSerial(text))
        {
            return Answer(text.Length == 0
                ? "Refused: production needs the lot before the first batch. Scan the lot number."
                : $"Refused: {text} is a unit serial, not a lot. Scan the lot number.");
        }

        Lot = text;
        _talk.Model.Header = _talk.Model.Header with { Lot = text };
        LogLot(_logger, text, Operator);
        _talk.Tell($"Lot {text}.");
        EnterLoading();
        return DialogueAction.None;
    }

    private async Task<DialogueAction> TakeLoadingAsync(string text, bool scanned, CancellationToken ct)
    {
        if (_boardShowsVerdicts)
        {
            // The first input after a batch: the units have been taken out; it is then taken as usual.
            _boardShowsVerdicts = false;
            _talk.Model.UnloadAll();
            ShowOutOfService();
        }

        var lower = text.ToLowerInvariant();
        var free = FreeSlots();
        if (!scanned)
        {
            if (text.Length == 0)
            {
                if (_loads.Count > 0)
                {
                    return StartBatch();
                }

                PromptScan();
                return free.Count == 0 ? Answer(NoSlotInService()) : DialogueAction.None;
            }

            if (lower == "quit")
            {
                return _loads.Count == 0
                    ? DialogueAction.Quit
                    : Answer($"Refused: {_loads.Count} unit(s) are loaded; press Enter to test them first, then 'quit'.");
            }

            if (lower == "lot")
            {
                EnterLot();
                return DialogueAction.None;
            }

            if (lower is "yes" or "cancel" || lower.StartsWith("cancel ", StringComparison.Ordinal))
            {
                return Answer($"No batch is running; nothing to {(lower == "yes" ? "confirm" : "cancel")}. {AllowedWhileLoading}");
            }

            if (lower.StartsWith("slot ", StringComparison.Ordinal))
            {
                return TakeSlotCommand(text);
            }
        }

        if (free.Count == 0)
        {
            return Answer(NoSlotInService());
        }

        var slot = free[0];
        var parts = text.Split(' ', 2, StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (!scanned && parts.Length == 2 && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out var named))
        {
            if (!free.Contains(named))
            {
                return Answer($"Refused: slot {named} is {SlotProblem(named)}.");
            }

            slot = named;
            text = parts[1];
        }

        var dayStart = new DateTimeOffset(_clock.GetUtcNow().UtcDateTime.Date, TimeSpan.Zero);
        var history = await _history.ForScanAsync(text, dayStart, ct).ConfigureAwait(false);
        var decision = _rules.Check(text, _loads.Select(l => l.Serial).ToList(), history);
        if (!decision.Accepted)
        {
            var looksLikeCommand = !scanned && text.Length > 0 && !text.Any(char.IsDigit);
            return Answer($"Refused: {decision.Reason}.{(looksLikeCommand ? " " + AllowedWhileLoading : string.Empty)}");
        }

        _loads.Add(new SlotLoad(slot, decision.Serial));
        _talk.Model.Loaded(slot, decision.Serial, decision.IsRetest);
        _talk.Log($"Loaded {decision.Serial} in slot {slot}{(decision.IsRetest ? " (retest)" : string.Empty)}.");
        LogScanned(_logger, decision.Serial, slot, decision.IsRetest, scanned ? "serial scanner" : "keyboard");
        if (FreeSlots().Count == 0)
        {
            return StartBatch();
        }

        PromptScan();
        return DialogueAction.None;
    }

    private DialogueAction StartBatch()
    {
        if (_production && (Operator is null || Lot is null))
        {
            // Cannot happen through the states above; kept so that no path starts a production batch without both.
            return Answer("Refused: production needs the operator's badge and the lot before a batch.");
        }

        return DialogueAction.StartBatch;
    }

    private DialogueAction TakeSlotCommand(string text)
    {
        var parts = text.Split(' ', 4, StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (parts.Length < 3 || !int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out var slot)
            || parts[2].ToLowerInvariant() is not ("off" or "on"))
        {
            return Answer("Type 'slot N off REASON' to take slot N out of service, 'slot N on' to put it back.");
        }

        if (!_slots.Contains(slot))
        {
            return Answer($"Refused: there is no slot {slot} (slots {SlotList()}).");
        }

        if (_loads.Any(l => l.Slot == slot))
        {
            return Answer($"Refused: slot {slot} holds a unit scanned for this batch; test the batch first.");
        }

        var now = _clock.GetUtcNow();
        if (parts[2].Equals("on", StringComparison.OrdinalIgnoreCase))
        {
            if (!_outOfService.Remove(slot))
            {
                return Answer($"Slot {slot} is already in service.");
            }

            _slotLog.Record(slot, inService: true, reason: null, Operator, now);
            _talk.Model.OutOfService(slot, null);
            _talk.Tell($"Slot {slot} is back in service.");
            PromptScan();
            return DialogueAction.None;
        }

        if (parts.Length < 4)
        {
            return Answer($"Refused: say why, e.g. 'slot {slot} off insert worn'.");
        }

        _outOfService[slot] = parts[3];
        _slotLog.Record(slot, inService: false, parts[3], Operator, now);
        _talk.Model.OutOfService(slot, parts[3]);
        _talk.Tell($"Slot {slot} is out of service: {parts[3]}.");
        PromptScan();
        return DialogueAction.None;
    }

    private void ShowOutOfService()
    {
        foreach (var (slot, reason) in _outOfService)
        {
            _talk.Model.OutOfService(slot, reason);
        }
    }

    private void PromptScan()
    {
        var free = FreeSlots();
        if (free.Count == 0)
        {
            _talk.Say(NoSlotInService());
            return;
        }

        _talk.Say(_loads.Count == 0
            ? $"Scan the serial for slot {free[0]} (or type 'N SERIAL' for slot N)."
            : $"Scan the serial for slot {free[0]}, or press Enter to start the batch of {_loads.Count}.");
    }

    private string NoSlotInService() => _loads.Count > 0
        ? $"Every slot in service is loaded; press Enter to start the batch of {_loads.Count}."
        : "Every slot is out of service; type 'slot N on' to put one back.";

    private List<int> FreeSlots() => _slots.Where(s => !_outOfService.ContainsKey(s) && _loads.All(l => l.Slot != s)).ToList();

    private string SlotProblem(int slot) =>
        !_slots.Contains(slot) ? $"not a slot of this fixture (slots {SlotList()})"
        : _outOfService.TryGetValue(slot, out var why) ? $"out of service ({why})"
        : "already loaded";

    private bool LooksLikeSerial(string text) => _rules.Check(text, [], SerialHistory.None).Accepted;
}
