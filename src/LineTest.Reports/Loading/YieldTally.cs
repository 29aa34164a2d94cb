using LineTest.Core.Statistics;

namespace LineTest.Reports.Loading;

/// <summary>
/// Yield counted by the source instead of from the loaded runs (a database that can <c>GROUP BY</c>): overall, per
/// group of the report's grouping and per UTC day, each unit counted with all its runs in the group of its first run,
/// the rule <see cref="Building.ReportBuilder"/> applies to loaded runs. The builder turns the counts into rates and
/// Pareto bars with <see cref="YieldAnalysis.Summarize(YieldCounts)"/>, so both ways give the same report. A source
/// that fills a tally may load its runs without outcomes (<see cref="RunTable.AddWithoutOutcome"/>).
/// </summary>
public sealed class YieldTally
{
    private readonly Dictionary<string, YieldCounts> _groups = new(StringComparer.Ordinal);
    private readonly Dictionary<string, YieldCounts> _days = new(StringComparer.Ordinal);

    /// <summary>All selected runs and their units.</summary>
    public YieldCounts Overall { get; } = new();

    /// <summary>Each unit's first run only (for <see cref="ReportQuery.FirstRunsOnly"/>: the Pareto of first-run failures).</summary>
    public YieldCounts FirstRuns { get; } = new();

    /// <summary>
    /// For <see cref="ReportQuery.FirstRunsOnly"/>: per loaded run (in <see cref="RunTable"/> order), true when it is its
    /// unit's first run; null when not counted.
    /// </summary>
    public bool[]? FirstRunFlags { get; set; }

    /// <summary>Counts per group key (the key <see cref="RunTable.GroupKeyOf"/> gives the unit's first run).</summary>
    public IReadOnlyDictionary<string, YieldCounts> Groups => _groups;

    /// <summary>Counts per UTC day (yyyy-MM-dd) of the unit's first run.</summary>
    public IReadOnlyDictionary<string, YieldCounts> Days => _days;

    /// <summary>The counts of group <paramref name="key"/>, created on first use.</summary>
    public YieldCounts Group(string key) => Of(_groups, key);

    /// <summary>The counts of day <paramref name="key"/> (yyyy-MM-dd), created on first use.</summary>
    public YieldCounts Day(string key) => Of(_days, key);

    private static YieldCounts Of(Dictionary<string, YieldCounts> map, string key)
    {
        ArgumentNullException.ThrowIfNull(key);
        if (!map.TryGetValue(key, out var counts))
        {
            counts = new YieldCounts();
            map.Add(key, counts);
        }

        return counts;
    }
}
