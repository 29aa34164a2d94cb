namespace LineTest.Core.Stability;

/// <summary>What a <see cref="StabilityWindow"/> says now.</summary>
/// <param name="IsStable">True when band and drift are both met over a full window.</param>
/// <param name="Mean">Mean of the window, if any readings.</param>
/// <param name="DriftPerMinute">Least-squares slope per minute.</param>
/// <param name="MaxDeviation">Largest |reading − mean|.</param>
/// <param name="Why">Plain words: stable, still drifting, outside the band…</param>
public sealed record StabilityVerdict(bool IsStable, double? Mean, double? DriftPerMinute, double? MaxDeviation, string Why);
