namespace LineTest.Core.Sequences.Steps;

/// <summary>The instrument pacing a step's time estimate is built from.</summary>
/// <param name="Units">Units in the batch.</param>
/// <param name="ReferenceReadSeconds">One reference reading, seconds.</param>
/// <param name="MeterReadSeconds">One meter (or source-measure unit) reading, seconds.</param>
public sealed record StepTimeModel(int Units, double ReferenceReadSeconds, double MeterReadSeconds);
