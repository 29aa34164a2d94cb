namespace LineTest.Station.Hosting;

/// <summary>Where the operator dialogue is: what the next thing typed or scanned means.</summary>
public enum DialogueState
{
    /// <summary>Production mode, before the first batch: the operator's badge is expected.</summary>
    Badge,

    /// <summary>The lot is expected (production before the first batch, or after <c>lot</c>).</summary>
    Lot,

    /// <summary>Serials are scanned into slots; Enter starts the batch.</summary>
    Loading,

    /// <summary>A batch runs: only cancel, history and answers to the sequence's prompts are taken.</summary>
    Running,

    /// <summary>"Cancel the whole batch?" is asked.</summary>
    ConfirmBatchCancel,

    /// <summary>"Cancel slot N?" is asked.</summary>
    ConfirmSlotCancel,

    /// <summary>Ctrl-C during a batch: "Stop the station?" is asked.</summary>
    ConfirmStop,

    /// <summary>The station is stopping; nothing more is taken.</summary>
    Stopping,
}
