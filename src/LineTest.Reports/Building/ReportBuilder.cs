using LineTest.Core.Statistics;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Building;

/// <summary>Computes a <see cref="QualityReport"/> from loaded data with the statistics of LineTest.Core.</summary>
public static class ReportBuilder
{
    /// <summary>Builds the report. The data's values must be in run order (they are, as loaded).</summary>
    /// <param name="data">Runs and readings.</param>
    /// <param name="query">Filters used (for the title block) and the grouping.</param>
    /// <param name="time">Clock for the time the report was made.</param>
    public static QualityReport Build(ReportData data, ReportQuery query, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(query);
        ArgumentNullException.ThrowIfNull(time);

        // Series are independent and their analysis only reads the loaded data, so a large report uses every core;
        // results go into their series' position, so the order stays the load order.
        var series = data.Readings.ToList();
        var readings = new ReadingStatistics[series.Count];
        var slots = new SlotBiasEntry[series.Count];
        Parallel.For(0, series.Count, i =>
        {
            readings[i] = Analyze(series[i]);
            slots[i] = SlotBiasOf(series[i], data.Runs);
        });

        return new QualityReport
        {
            GeneratedUtc = time.GetUtcNow(),
            Sources = data.Sources,
            Query = query,
            Yield = YieldAnalysis.Summarize(data.Runs.Outcomes()),
            Readings = readings,
            Slots = slots,
            Groups = query.GroupBy == ReportGrouping.None ? [] : Groups(data, query.GroupBy),
            DailyYield = data.Runs.HasTimes ? Daily(data.Runs) : [],
        };
    }

    /// <summary>Statistics of one series.</summary>
    public static ReadingStatistics Analyze(ReadingSeries series)
    {
        ArgumentNullException.ThrowIfNull(series);
        var values = series.Values;
        var limits = new SpecLimits(series.Low, series.High);
        var capability = Capability.Analyze(values, limits);
        var normality = AndersonDarling.Test(values);
        var chart = IndividualsChart.Compute(values);
        return new ReadingStatistics
        {
            Name = series.Name,
            Unit = series.Unit,
            Low = series.Low,
            High = series.High,
            LimitsChanged = series.LimitsChanged,
            Missing = series.Missing,
            Capability = capability,
            Normality = normality.Value,
            NormalityNote = normality.Reason,
            Chart = chart.Value,
            ChartNote = chart.Reason,
            Values = values.ToArray(),
        };
    }

    private static SlotBiasEntry SlotBiasOf(ReadingSeries series, RunTable runs)
    {
        var runIndices = series.Runs;
        var slotOf = new int[runIndices.Length];
        for (var i = 0; i < slotOf.Length; i++)
        {
            slotOf[i] = runs.Slot(runIndices[i]);
        }

        var outcome = SlotBias.Analyze(slotOf, series.Values);
        return new SlotBiasEntry(series.Name, series.Unit, outcome.Value, outcome.Reason);
    }

    private static (List<string> Keys, int[] GroupOfRun) Partition(RunTable runs, ReportGrouping grouping)
    {
        var ids = new Dictionary<string, int>(StringComparer.Ordinal);
        var keys = new List<string>();
        var groupOfRun = new int[runs.Count];
        for (var r = 0; r < runs.Count; r++)
        {
            var key = runs.GroupKey(r, grouping);
            if (!ids.TryGetValue(key, out var id))
            {
                id = keys.Count;
                ids.Add(key, id);
                keys.Add(key);
            }

            groupOfRun[r] = id;
        }

        return (keys, groupOfRun);
    }

    private static List<int>[] RunsByGroup(int groupCount, int[] groupOfRun)
    {
        var runsOf = new List<int>[groupCount];
        for (var g = 0; g < groupCount; g++)
        {
            runsOf[g] = [];
        }

        for (var r = 0; r < groupOfRun.Length; r++)
        {
            runsOf[groupOfRun[r]].Add(r);
        }

        return runsOf;
    }

    private static List<GroupReport> Groups(ReportData data, ReportGrouping grouping)
    {
        var (keys, groupOfRun) = Partition(data.Runs, grouping);
        var runsOf = RunsByGroup(keys.Count, groupOfRun);

        // Per group and reading, the values in run order: one pass over each series.
        var perGroup = new List<GroupReadingStatistics>[keys.Count];
        for (var g = 0; g < keys.Count; g++)
        {
            perGroup[g] = [];
        }

        foreach (var series in data.Readings)
        {
            var buckets = new List<double>[keys.Count];
            var values = series.Values;
            var runIndices = series.Runs;
            for (var i = 0; i < values.Length; i++)
            {
                var g = groupOfRun[runIndices[i]];
                (buckets[g] ??= []).Add(values[i]);
            }

            var limits = new SpecLimits(series.Low, series.High);
            for (var g = 0; g < keys.Count; g++)
            {
                if (buckets[g] is not { } bucket)
                {
                    continue;
                }

                var c = Capability.Analyze(System.Runtime.InteropServices.CollectionsMarshal.AsSpan(bucket), limits);
                perGroup[g].Add(new GroupReadingStatistics(series.Name, c.Count, c.Mean, c.StdDevOverall, c.StdDevWithin, c.Cpk, c.Ppk));
            }
        }

        var groups = new List<GroupReport>(keys.Count);
        for (var g = 0; g < keys.Count; g++)
        {
            groups.Add(new GroupReport(keys[g], YieldAnalysis.Summarize(data.Runs.Outcomes(runsOf[g])), perGroup[g]));
        }

        groups.Sort((a, b) => RunTable.CompareGroupKeys(grouping, a.Key, b.Key));
        return groups;
    }

    private static List<DailyYield> Daily(RunTable runs)
    {
        var (keys, groupOfRun) = Partition(runs, ReportGrouping.Day);
        var runsOf = RunsByGroup(keys.Count, groupOfRun);
        var days = new List<DailyYield>(keys.Count);
        for (var g = 0; g < keys.Count; g++)
        {
            var y = YieldAnalysis.Summarize(runs.Outcomes(runsOf[g]));
            days.Add(new DailyYield(keys[g], y.Runs, y.FirstPassYield, y.FinalYield));
        }

        days.Sort((a, b) => string.CompareOrdinal(a.Day, b.Day));
        return days;
    }
}
