using LineTest.Core.Statistics;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Building;

/// <summary>A finished quality report, ready to be written as console tables, JSON, CSV or HTML.</summary>
public sealed record QualityReport
{
    /// <summary>Default title.</summary>
    public const string DefaultTitle = "LineTest quality report";

    /// <summary>Title.</summary>
    public string Title { get; init; } = DefaultTitle;

    /// <summary>When the report was made (UTC).</summary>
    public required DateTimeOffset GeneratedUtc { get; init; }

    /// <summary>Databases or files read.</summary>
    public required IReadOnlyList<string> Sources { get; init; }

    /// <summary>Filters and grouping used.</summary>
    public required ReportQuery Query { get; init; }

    /// <summary>Yield over all selected runs, with the failure Pareto and error reasons.</summary>
    public required YieldSummary Yield { get; init; }

    /// <summary>Per reading, in order of first appearance.</summary>
    public required IReadOnlyList<ReadingStatistics> Readings { get; init; }

    /// <summary>Slot-bias check per reading (same order as <see cref="Readings"/>).</summary>
    public required IReadOnlyList<SlotBiasEntry> Slots { get; init; }

    /// <summary>Groups in key order when <see cref="ReportQuery.GroupBy"/> is set; empty otherwise.</summary>
    public required IReadOnlyList<GroupReport> Groups { get; init; }

    /// <summary>Input rows left out (<c>--skip-bad-rows</c>), each "line N: reason"; empty when none.</summary>
    public IReadOnlyList<string> SkippedRows { get; init; } = [];

    /// <summary>Yield per UTC day, oldest first (the yield trend); empty when run times are unknown.</summary>
    public required IReadOnlyList<DailyYield> DailyYield { get; init; }
}
