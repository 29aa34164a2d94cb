using LineTest.Core.Results;
using LineTest.Core.Units;

namespace LineTest.Station.Screen;

/// <summary>One slot as the operator sees it.</summary>
public sealed record SlotView(int Slot)
{
    /// <summary>The serial loaded, or null when empty.</summary>
    public string? Serial { get; init; }

    /// <summary>The unit's state, or null when empty.</summary>
    public UnitState? State { get; init; }

    /// <summary>The step in progress.</summary>
    public string Step { get; init; } = string.Empty;

    /// <summary>Progress through the sequence, 0…1.</summary>
    public double Progress { get; init; }

    /// <summary>Estimated time left, when known.</summary>
    public TimeSpan? TimeLeft { get; init; }

    /// <summary>The verdict once the run has ended.</summary>
    public Verdict? Verdict { get; init; }

    /// <summary>Why it failed or errored.</summary>
    public string? Reason { get; init; }

    /// <summary>True when the serial ran before (a retest).</summary>
    public bool IsRetest { get; init; }

    /// <summary>What the unit is doing, in the operator's words (empty: the state's words).</summary>
    public string Doing { get; init; } = string.Empty;

    /// <summary>Where the unit goes after its run, as the sequence names it.</summary>
    public string? Disposition { get; init; }

    /// <summary>True when the run was cancelled (its verdict is error).</summary>
    public bool Cancelled { get; init; }

    /// <summary>Why the slot is out of service; null when in service.</summary>
    public string? OutOfService { get; init; }
}
