namespace LineTest.Runtime.Batches;

/// <summary>A unit scanned into a slot.</summary>
/// <param name="Slot">Slot number (1-based).</param>
/// <param name="Serial">The scanned serial.</param>
public sealed record SlotLoad(int Slot, string Serial);
