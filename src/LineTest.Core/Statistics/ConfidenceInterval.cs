namespace LineTest.Core.Statistics;

/// <summary>A two-sided confidence interval for an estimate.</summary>
/// <param name="Lower">Lower bound.</param>
/// <param name="Upper">Upper bound.</param>
/// <param name="Level">Confidence level, e.g. 0.95.</param>
public readonly record struct ConfidenceInterval(double Lower, double Upper, double Level);
