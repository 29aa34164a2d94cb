namespace LineTest.Rig.Simulation;

/// <summary>Instrument faults the simulated rig can be told to produce.</summary>
public enum RigFaultKind
{
    /// <summary>The voltmeter stops answering: reads end in <c>NoAnswer</c>.</summary>
    MeterSilent,

    /// <summary>The voltmeter answers with replies that cannot be parsed: reads end in <c>GarbageReply</c>.</summary>
    MeterGarbage,

    /// <summary>The voltmeter's port disappears: reads end in <c>PortLost</c>.</summary>
    MeterPortLost,

    /// <summary>The temperature source stops answering: every command ends in <c>NoAnswer</c>.</summary>
    SourceSilent,

    /// <summary>
    /// The source's heater fails: the block drifts towards ambient, its status carries a fault text and
    /// setpoint or standby commands end in <c>InstrumentError</c>.
    /// </summary>
    SourceHeaterFault,

    /// <summary>The reference readout stops answering: reads end in <c>NoAnswer</c>.</summary>
    ReferenceSilent,

    /// <summary>The reference sensor drifts: it reports a temperature that departs from the well's at a set rate.</summary>
    ReferenceDrift,

    /// <summary>The source-measure unit stops answering: every command ends in <c>NoAnswer</c>.</summary>
    SourceMeterSilent,

    /// <summary>A unit stops answering on its link: commands end in <c>NoAnswer</c>.</summary>
    UnitSilent,

    /// <summary>A unit answers with corrupted frames: commands end in <c>GarbageReply</c>.</summary>
    UnitGarbage,
}
