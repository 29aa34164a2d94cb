using LineTest.Core.Statistics;

namespace LineTest.Reports.Building;

/// <summary>Yield and reading statistics of one group (one station, slot, lot, day or revision).</summary>
/// <param name="Key">The group's value, e.g. "ST-01", "3", "2025-03-04", "ctp40a-eol rev 3".</param>
/// <param name="Yield">Yield of the group's runs.</param>
/// <param name="Readings">Per reading, in the report's reading order (readings without values in the group are left out).</param>
public sealed record GroupReport(string Key, YieldSummary Yield, IReadOnlyList<GroupReadingStatistics> Readings);
