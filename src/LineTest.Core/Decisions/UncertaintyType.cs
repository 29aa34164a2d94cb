namespace LineTest.Core.Decisions;

/// <summary>How a standard uncertainty was evaluated (JCGM 100:2008 §4.2, §4.3).</summary>
public enum UncertaintyType
{
    /// <summary>Type A: statistical analysis of a series of observations (§4.2).</summary>
    A,

    /// <summary>Type B: other means — certificates, specifications, resolution (§4.3).</summary>
    B,
}
