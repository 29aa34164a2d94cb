namespace LineTest.Core.Statistics;

/// <summary>One slot's values in a slot-bias check.</summary>
/// <param name="Slot">Slot number.</param>
/// <param name="Count">Number of values from this slot.</param>
/// <param name="Mean">Mean of this slot's values.</param>
/// <param name="OffsetFromGrandMean">Mean minus the grand mean (the mean of all values pooled).</param>
public sealed record SlotGroup(int Slot, int Count, double Mean, double OffsetFromGrandMean);
