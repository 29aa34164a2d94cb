using System.Buffers;
using System.Globalization;
using System.Runtime.InteropServices;
using LineTest.Core.Statistics;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Building;

/// <summary>Computes a <see cref="QualityReport"/> from loaded data with the statistics of LineTest.Core.</summary>
/// <remarks>
/// Readings are analysed per (sequence, reading name): a sequence tests one product, and two products' values are
/// never pooled. In groups, a unit's runs all count in the group of its first run, so the groups' runs and units add
/// up to the overall table; reading values count in the group of their own run.
/// </remarks>
public static class ReportBuilder
{
    /// <summary>Builds the report. The data's values must be in run order (they are, as loaded).</summary>
    /// <param name="data">Runs and readings.</param>
    /// <param name="query">Filters used (for the title block), the grouping and whether only first runs count.</param>
    /// <param name="time">Clock for the time the report was made.</param>
    public static QualityReport Build(ReportData data, ReportQuery query, TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(query);
        ArgumentNullException.ThrowIfNull(time);

        var tally = data.Tally;
        if (tally is null)
        {
            // Made once here, before the work below shares the table across threads.
            data.Runs.Units();
        }

        var firstRuns = !query.FirstRunsOnly ? null
            : tally is null ? data.Runs.FirstRuns()
            : tally.FirstRunFlags ?? throw new ArgumentException("The source counted yield but did not mark each unit's first run, which --first-runs needs.", nameof(data));

        // Series are independent and their analysis only reads the loaded data, so a large report uses every core;
        // results go into their series' position, so the order stays the load order. The yield, the groups and the days
        // only read the runs, and are counted meanwhile.
        var series = data.Readings.ToList();
        var readings = new ReadingStatistics[series.Count];
        var slots = new SlotBiasEntry[series.Count];
        YieldSummary? yield = null;
        List<GroupReport> groups = [];
        List<DailyYield> daily = [];
        Parallel.Invoke(
            () => Parallel.For(0, series.Count, i =>
            {
                var (values, kept) = Selected(series[i], firstRuns);
                var runs = kept is null ? series[i].Runs : kept;
                readings[i] = Analyze(series[i], values, runs, data);
                slots[i] = SlotBiasOf(series[i], values, runs, data.Runs);
            }),
            () =>
            {
                yield = tally is null ? YieldAnalysis.Summarize(data.Runs.CountYield()) : YieldAnalysis.Summarize(tally.Overall);
                if (firstRuns is not null)
                {
                    // First-pass figures are already about first runs; the Pareto of failures is narrowed to them.
                    var first = tally is null ? YieldAnalysis.Summarize(data.Runs.CountYield(Indices(firstRuns))) : YieldAnalysis.Summarize(tally.FirstRuns);
                    yield = yield with { FailurePareto = first.FailurePareto, ErrorReasons = first.ErrorReasons };
                }
            },
            () => groups = query.GroupBy == ReportGrouping.None ? [] : Groups(data, query, firstRuns),
            () => daily = data.Runs.HasTimes ? Daily(data.Runs, tally) : []);

        return new QualityReport
        {
            GeneratedUtc = time.GetUtcNow(),
            Sources = data.Sources,
            Query = query,
            Yield = yield!,
            Readings = readings,
            Slots = slots,
            Groups = groups,
            DailyYield = daily,
            SkippedRows = data.SkippedRows,
        };
    }

    /// <summary>Statistics of one series over all its values.</summary>
    public static ReadingStatistics Analyze(ReadingSeries series)
    {
        ArgumentNullException.ThrowIfNull(series);
        return Analyze(series, series.Values.ToArray(), series.Runs, data: null);
    }

    private static ReadingStatistics Analyze(ReadingSeries series, double[] values, ReadOnlySpan<int> runs, ReportData? data)
    {
        var limits = new SpecLimits(series.Low, series.High);
        CapabilityResult? capability = null;
        StatisticOutcome<AndersonDarlingResult>? normality = null;
        StatisticOutcome<PercentileCapabilityResult>? percentile = null;
        StatisticOutcome<IndividualsChartResult>? chart = null;

        // The control chart and the tests on the sorted values are independent: a large series is analysed on two cores.
        // One sort serves the normality test and the percentiles.
        Parallel.Invoke(
            () => chart = IndividualsChart.Compute(values),
            () =>
            {
                capability = Capability.Analyze(values, limits);

                // The sorted copy is only needed here: a pooled buffer, not a new large array per series.
                var buffer = ArrayPool<double>.Shared.Rent(values.Length);
                try
                {
                    var sorted = buffer.AsSpan(0, values.Length);
                    values.CopyTo(sorted);
                    DoubleSort.Ascending(sorted);
                    normality = AndersonDarling.Test(values, sorted);
                    percentile = PercentileCapability.AnalyzeSorted(sorted, limits);
                }
                finally
                {
                    ArrayPool<double>.Shared.Return(buffer);
                }
            });
        return new ReadingStatistics
        {
            Name = series.Name,
            Unit = series.Unit,
            SequenceId = series.SequenceId,
            Covers = data is null ? Describe(series.SequenceId, null, []) : CoversOf(series, runs, data),
            Low = series.Low,
            High = series.High,
            LimitsChanged = series.LimitsChanged,
            Missing = series.Missing,
            Capability = capability!,
            Normality = normality!.Value,
            NormalityNote = normality.Reason,
            Percentile = percentile!.Value,
            PercentileNote = percentile.Reason,
            Chart = chart!.Value,
            ChartNote = chart.Reason,
            Values = values,
        };
    }

    /// <summary>The values analysed and, when only some are kept, their runs (null: all of the series' runs).</summary>
    private static (double[] Values, int[]? Runs) Selected(ReadingSeries series, bool[]? firstRuns)
    {
        var values = series.Values;
        var runs = series.Runs;
        if (firstRuns is null)
        {
            return (values.ToArray(), null);
        }

        var keptValues = new List<double>(values.Length);
        var keptRuns = new List<int>(values.Length);
        for (var i = 0; i < values.Length; i++)
        {
            if (firstRuns[runs[i]])
            {
                keptValues.Add(values[i]);
                keptRuns.Add(runs[i]);
            }
        }

        return (keptValues.ToArray(), keptRuns.ToArray());
    }

    private static string CoversOf(ReadingSeries series, ReadOnlySpan<int> runs, ReportData data)
    {
        // Consecutive runs nearly always share a revision: the set is asked only when it changes.
        var revisions = new SortedSet<int>();
        int? last = null;
        foreach (var run in runs)
        {
            if (data.Runs.Revision(run) is { } revision && revision != last)
            {
                revisions.Add(revision);
                last = revision;
            }
        }

        var product = series.SequenceId is { } id && data.Products.TryGetValue(id, out var p) ? p : null;
        return Describe(series.SequenceId, product, revisions);
    }

    private static string Describe(string? sequenceId, string? product, IReadOnlyCollection<int> revisions)
    {
        if (sequenceId is null)
        {
            return "runs without a sequence id (products cannot be told apart)";
        }

        var text = product is null ? sequenceId : $"{product}: {sequenceId}";
        return revisions.Count switch
        {
            0 => text,
            1 => string.Create(CultureInfo.InvariantCulture, $"{text} rev {revisions.First()}"),
            _ => $"{text} revs {string.Join(", ", revisions.Select(r => r.ToString(CultureInfo.InvariantCulture)))}",
        };
    }

    private static SlotBiasEntry SlotBiasOf(ReadingSeries series, double[] values, ReadOnlySpan<int> runs, RunTable table)
    {
        var buffer = ArrayPool<int>.Shared.Rent(runs.Length);
        StatisticOutcome<SlotBiasResult> outcome;
        try
        {
            var slotOf = buffer.AsSpan(0, runs.Length);
            for (var i = 0; i < slotOf.Length; i++)
            {
                slotOf[i] = table.Slot(runs[i]);
            }

            outcome = SlotBias.Analyze(slotOf, values);
        }
        finally
        {
            ArrayPool<int>.Shared.Return(buffer);
        }

        return new SlotBiasEntry(series.Name, series.Unit, outcome.Value, outcome.Reason) { SequenceId = series.SequenceId };
    }

    private static List<int> Indices(bool[] flags)
    {
        var list = new List<int>();
        for (var i = 0; i < flags.Length; i++)
        {
            if (flags[i])
            {
                list.Add(i);
            }
        }

        return list;
    }

    private static (List<string> Keys, int[] GroupOfRun) Partition(RunTable runs, ReportGrouping grouping, NamedShifts? shifts)
    {
        var ids = new Dictionary<string, int>(StringComparer.Ordinal);
        var keys = new List<string>();
        var groupOfRun = new int[runs.Count];

        // Days and slots are numbers: the key text is made once per day or slot, not once per run.
        var byNumber = grouping switch
        {
            ReportGrouping.Day when runs.HasTimes => (Func<int, long>)(r => runs.EndedUtc(r).UtcTicks / TimeSpan.TicksPerDay),
            ReportGrouping.Slot => r => runs.Slot(r),
            _ => null,
        };
        var known = new Dictionary<long, int>();
        for (var r = 0; r < runs.Count; r++)
        {
            if (byNumber is not null && known.TryGetValue(byNumber(r), out var seen))
            {
                groupOfRun[r] = seen;
                continue;
            }

            var key = runs.GroupKey(r, grouping, shifts);
            if (!ids.TryGetValue(key, out var id))
            {
                id = keys.Count;
                ids.Add(key, id);
                keys.Add(key);
            }

            if (byNumber is not null)
            {
                known[byNumber(r)] = id;
            }

            groupOfRun[r] = id;
        }

        return (keys, groupOfRun);
    }

    /// <summary>
    /// Each group's yield, every unit counted in the group of its first run (so every unit is in exactly one group, and
    /// all its runs count there): from the runs in one pass, or from the source's counts when it counted them.
    /// </summary>
    private static YieldCounts[] GroupCounts(RunTable runs, int[] groupOfRun, List<string> keys, IReadOnlyDictionary<string, YieldCounts>? counted)
    {
        if (counted is not null)
        {
            // A group that none of its units started in has no counts: the summary of no runs.
            return [.. keys.Select(k => counted.TryGetValue(k, out var c) ? c : new YieldCounts())];
        }

        return runs.CountYieldByFirstRunGroup(groupOfRun, keys.Count);
    }

    private static List<GroupReport> Groups(ReportData data, ReportQuery query, bool[]? firstRuns)
    {
        var (keys, groupOfRun) = Partition(data.Runs, query.GroupBy, query.Shifts);
        var counts = GroupCounts(data.Runs, groupOfRun, keys, data.Tally?.Groups);

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
                if (firstRuns is null || firstRuns[runIndices[i]])
                {
                    var g = groupOfRun[runIndices[i]];
                    (buckets[g] ??= []).Add(values[i]);
                }
            }

            var limits = new SpecLimits(series.Low, series.High);
            for (var g = 0; g < keys.Count; g++)
            {
                if (buckets[g] is not { } bucket)
                {
                    continue;
                }

                var c = Capability.Analyze(CollectionsMarshal.AsSpan(bucket), limits);
                perGroup[g].Add(new GroupReadingStatistics(series.Name, c.Count, c.Mean, c.StdDevOverall, c.StdDevWithin, c.Cpk, c.Ppk, series.SequenceId));
            }
        }

        var groups = new List<GroupReport>(keys.Count);
        for (var g = 0; g < keys.Count; g++)
        {
            // A group whose units all started in another group has no runs of its own for yield.
            groups.Add(new GroupReport(keys[g], YieldAnalysis.Summarize(counts[g]), perGroup[g]));
        }

        groups.Sort((a, b) => RunTable.CompareGroupKeys(query.GroupBy, a.Key, b.Key));
        return groups;
    }

    private static List<DailyYield> Daily(RunTable runs, YieldTally? tally)
    {
        var (keys, groupOfRun) = Partition(runs, ReportGrouping.Day, null);
        var counts = GroupCounts(runs, groupOfRun, keys, tally?.Days);
        var days = new List<DailyYield>(keys.Count);
        for (var g = 0; g < keys.Count; g++)
        {
            var y = YieldAnalysis.Summarize(counts[g]);
            days.Add(new DailyYield(keys[g], y.Runs, y.FirstPassYield, y.FinalYield));
        }

        days.Sort((a, b) => string.CompareOrdinal(a.Day, b.Day));
        return days;
    }
}
