namespace LineTest.Station.Campaign;

/// <summary>The fault families a campaign injects, one per faulted batch.</summary>
public enum CampaignFault
{
    /// <summary>An instrument stops answering: the voltmeter, the reference readout or the source.</summary>
    SilentInstrument,

    /// <summary>Replies that cannot be parsed: from the voltmeter or from one unit's link.</summary>
    GarbageReplies,

    /// <summary>The voltmeter's port is lost.</summary>
    LostPort,

    /// <summary>One unit stops answering on its link in the middle of its run.</summary>
    UnitStopsAnswering,

    /// <summary>The source's heater fails after a setpoint was accepted: it never settles.</summary>
    SourceNeverSettles,

    /// <summary>The reference sensor starts drifting after a setpoint was commanded.</summary>
    ReferenceDrifts,
}
