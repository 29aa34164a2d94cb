using LineTest.Core.Statistics;

namespace LineTest.Reports.Building;

/// <summary>The slot-bias check of one reading.</summary>
/// <param name="Name">Reading name.</param>
/// <param name="Unit">Unit of the offsets.</param>
/// <param name="Result">The analysis of variance; null when <paramref name="Reason"/> says why not.</param>
/// <param name="Reason">Why it was not computed (e.g. one slot only).</param>
public sealed record SlotBiasEntry(string Name, string Unit, SlotBiasResult? Result, string? Reason)
{
    /// <summary>The sequence (product) of the values; null when the source names none.</summary>
    public string? SequenceId { get; init; }
}
