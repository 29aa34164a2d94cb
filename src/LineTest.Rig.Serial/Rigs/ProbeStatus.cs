namespace LineTest.Rig.Serial.Rigs;

/// <summary>How one instrument came out of a probe.</summary>
public enum ProbeStatus
{
    /// <summary>It identified itself and gave a reading.</summary>
    Usable,

    /// <summary>A unit link whose port works but on which no unit answered (no unit loaded, or a silent one).</summary>
    NoUnit,

    /// <summary>It cannot be used; the problem says why.</summary>
    Unusable,
}
