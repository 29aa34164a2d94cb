namespace LineTest.Station.Hosting;

/// <summary>What the station must do after the dialogue took an input.</summary>
public enum DialogueAction
{
    /// <summary>Nothing beyond what was said.</summary>
    None,

    /// <summary>Start a batch of <see cref="OperatorDialogue.Loads"/>.</summary>
    StartBatch,

    /// <summary>Cancel the whole batch (confirmed).</summary>
    CancelBatch,

    /// <summary>Cancel one slot (confirmed); the slot is <see cref="OperatorDialogue.SlotToCancel"/>.</summary>
    CancelSlot,

    /// <summary>Stop the station (Ctrl-C confirmed): the batch is cancelled, the source goes to standby, exit 130.</summary>
    Stop,

    /// <summary>End the shift (<c>quit</c> with nothing loaded, or end of input).</summary>
    Quit,
}
