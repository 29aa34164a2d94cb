namespace LineTest.Core.Statistics;

/// <summary>
/// One-way analysis of variance of a measurement grouped by slot. A small <see cref="PValue"/> says the
/// slot means differ by more than the spread within slots explains: a slot is biased.
/// </summary>
/// <param name="GrandMean">Mean of all values pooled.</param>
/// <param name="SumOfSquaresBetween">Σ nⱼ·(ȳⱼ − ȳ)².</param>
/// <param name="SumOfSquaresWithin">Σⱼ Σᵢ (yᵢⱼ − ȳⱼ)².</param>
/// <param name="DegreesOfFreedomBetween">k − 1.</param>
/// <param name="DegreesOfFreedomWithin">N − k.</param>
/// <param name="FStatistic">(SSB/(k − 1)) / (SSW/(N − k)).</param>
/// <param name="PValue">P(F(k − 1, N − k) &gt; F).</param>
/// <param name="Groups">Slots in ascending order.</param>
public sealed record SlotBiasResult(
    double GrandMean,
    double SumOfSquaresBetween,
    double SumOfSquaresWithin,
    int DegreesOfFreedomBetween,
    int DegreesOfFreedomWithin,
    double FStatistic,
    double PValue,
    IReadOnlyList<SlotGroup> Groups);
