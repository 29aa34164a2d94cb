namespace LineTest.Reports.Building;

/// <summary>One reading's statistics within one group.</summary>
/// <param name="Name">Reading name.</param>
/// <param name="Count">Number of numeric values in the group.</param>
/// <param name="Mean">Mean; null when there are none.</param>
/// <param name="StdDevOverall">Overall sample standard deviation; null when fewer than 2 values.</param>
/// <param name="StdDevWithin">Within standard deviation MR̄/1.128 in run order; null when fewer than 2 values.</param>
/// <param name="Cpk">Cpk (within σ); null when not defined.</param>
/// <param name="Ppk">Ppk (overall σ); null when not defined.</param>
/// <param name="SequenceId">The sequence (product) of the values; null when the source names none.</param>
public sealed record GroupReadingStatistics(
    string Name,
    int Count,
    double? Mean,
    double? StdDevOverall,
    double? StdDevWithin,
    double? Cpk,
    double? Ppk,
    string? SequenceId = null);
