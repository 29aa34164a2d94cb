using CsCheck;
using LineTest.Core.Results;
using LineTest.Core.Statistics;
using LineTest.Reports.Loading;

namespace LineTest.Reports.Tests.Loading;

public sealed class RunTableTests
{
    private static readonly DateTimeOffset T0 = new(2026, 3, 2, 6, 0, 0, TimeSpan.Zero);

    [Fact]
    public void AddWithoutOutcome_PlacesReadingsButRefusesOutcomeQuestions()
    {
        var table = new RunTable();

        var run = table.AddWithoutOutcome(T0, "ST-01", 3, "LOT-A", "ctp40a-eol", 3);

        Assert.False(table.HasOutcomes);
        Assert.Equal("ST-01", table.Station(run));
        Assert.Equal(3, table.Slot(run));
        Assert.Equal("ctp40a-eol rev 3", table.GroupKey(run, ReportGrouping.Revision));
        Assert.Throws<InvalidOperationException>(() => table.Serial(run));
        Assert.Throws<InvalidOperationException>(() => table.Outcome(run));
        Assert.Throws<InvalidOperationException>(() => table.FirstRuns());
        Assert.Throws<InvalidOperationException>(() => table.Add("CTP40-00001", T0, Verdict.Pass, "ST-01", 1, null, null, null, null, null));
    }

    /// <summary>
    /// The array count of yield must give exactly what <see cref="YieldAnalysis.Summarize(IReadOnlyList{RunOutcome})"/>
    /// gives for the same runs (the rule of record): retests, equal end times (first given is the first run, last given
    /// the last), blank and padded failure names, over every run and over subsets in increasing order.
    /// </summary>
    [Fact]
    public void CountYield_AnyRunsAndSubsets_SameSummaryAsTheOutcomeRule()
    {
        var run = Gen.Select(Gen.Int[0, 6], Gen.Int[0, 4], Gen.Int[0, 2], Gen.Int[0, 3]);
        Gen.Select(run.List[0, 40], Gen.Int[0, 1000]).Sample(sample =>
        {
            var (runs, seed) = sample;
            var table = new RunTable();
            foreach (var (unit, minute, verdict, name) in runs)
            {
                var why = name switch { 0 => null, 1 => "  ", 2 => " verify.error ", _ => "reference lost" };
                table.Add($"U-{unit}", T0.AddMinutes(minute), (Verdict)verdict, "ST-01", 1, null, null, null, why, why);
            }

            var random = new Random(seed);
            var subset = Enumerable.Range(0, table.Count).Where(_ => random.Next(2) == 0).ToList();
            Assert.Equal(Describe(YieldAnalysis.Summarize(table.Outcomes())), Describe(YieldAnalysis.Summarize(table.CountYield())));
            Assert.Equal(Describe(YieldAnalysis.Summarize(table.Outcomes(subset))), Describe(YieldAnalysis.Summarize(table.CountYield(subset))));
        });
    }

    /// <summary>
    /// Counting every group in one pass (each unit's runs all in its unit's group) must give, group by group, what
    /// <see cref="YieldAnalysis.Summarize(IReadOnlyList{RunOutcome})"/> gives for that group's runs (the rule of record).
    /// </summary>
    [Fact]
    public void CountYieldByUnitGroup_AnyRunsAndGroupsOfUnits_EachGroupAsTheOutcomeRuleOnItsRuns()
    {
        var run = Gen.Select(Gen.Int[0, 8], Gen.Int[0, 4], Gen.Int[0, 2], Gen.Int[0, 3]);
        Gen.Select(run.List[0, 50], Gen.Int[1, 4], Gen.Int[0, 1000]).Sample(sample =>
        {
            var (runs, groups, seed) = sample;
            var table = new RunTable();
            foreach (var (unit, minute, verdict, name) in runs)
            {
                var why = name switch { 0 => null, 1 => "  ", 2 => " verify.error ", _ => "reference lost" };
                table.Add($"U-{unit}", T0.AddMinutes(minute), (Verdict)verdict, "ST-01", 1, null, null, null, why, why);
            }

            var random = new Random(seed);
            var (unitOf, units) = table.Units();
            var groupOfUnit = Enumerable.Range(0, units).Select(_ => random.Next(groups)).ToArray();

            var counted = table.CountYieldByUnitGroup(groupOfUnit, groups);

            Assert.Equal(groups, counted.Length);
            for (var g = 0; g < groups; g++)
            {
                var ofGroup = Enumerable.Range(0, table.Count).Where(r => groupOfUnit[unitOf[r]] == g).ToList();
                Assert.Equal(Describe(YieldAnalysis.Summarize(table.Outcomes(ofGroup))), Describe(YieldAnalysis.Summarize(counted[g])));
            }
        });
    }

    [Fact]
    public void FirstRuns_EqualEndTimes_TheFirstAddedIsTheFirstRun()
    {
        var table = new RunTable();
        table.Add("U-1", T0.AddMinutes(5), Verdict.Fail, "ST-01", 1, null, null, null, "x", null);
        table.Add("U-2", T0, Verdict.Pass, "ST-01", 1, null, null, null, null, null);
        table.Add("U-1", T0, Verdict.Pass, "ST-01", 1, null, null, null, null, null);
        table.Add("U-1", T0, Verdict.Fail, "ST-01", 1, null, null, null, "x", null);

        Assert.Equal([false, true, true, false], table.FirstRuns());
        Assert.Equal([0, 1, 0, 0], table.Units().UnitOf);
        Assert.Equal(2, table.Units().Units);
    }

    private static string Describe(YieldSummary y) =>
        $"{y.Runs} {y.Units} {y.PassRuns} {y.FailRuns} {y.ErrorRuns} {y.UnitsPassedFirstRun} {y.UnitsPassedLastRun} {y.FirstPassYield} {y.FinalYield} {y.RetestRate} "
        + string.Join(";", y.FailurePareto.Select(b => $"{b.Name}={b.Count}")) + " | " + string.Join(";", y.ErrorReasons.Select(b => $"{b.Name}={b.Count}"));

    [Fact]
    public void AddWithoutOutcome_AfterRunsWithOutcomes_Refused()
    {
        var table = new RunTable();
        table.Add("CTP40-00001", T0, Verdict.Pass, "ST-01", 1, null, null, null, null, null);

        Assert.Throws<InvalidOperationException>(() => table.AddWithoutOutcome(T0, "ST-01", 1, null, null, null));
        Assert.True(table.HasOutcomes);
    }

    public static TheoryData<ReportGrouping, string> KeysOfOneRun => new()
    {
        { ReportGrouping.Station, "ST-02" },
        { ReportGrouping.Slot, "4" },
        { ReportGrouping.Lot, "(no lot)" },
        { ReportGrouping.Day, "2026-03-02" },
        { ReportGrouping.Shift, "night" },
        { ReportGrouping.Revision, "ctp40a-dac rev 2" },
        { ReportGrouping.Operator, "(no operator)" },
    };

    [Theory]
    [MemberData(nameof(KeysOfOneRun))]
    public void GroupKeyOf_SameFieldsAsALoadedRun_SameKey(ReportGrouping grouping, string expected)
    {
        var table = new RunTable();
        var at = T0.AddHours(17);
        var run = table.Add("CTP40-00001", at, Verdict.Pass, "ST-02", 4, null, "ctp40a-dac", 2, null, null);
        table.SetOperator(run, "   ");

        // 23:00 UTC falls in the default night shift (from 22:00) [common practice: three eight-hour shifts].
        Assert.Equal(expected, table.GroupKey(run, grouping));
        Assert.Equal(expected, RunTable.GroupKeyOf(grouping, "ST-02", 4, null, at, "ctp40a-dac", 2, "   "));
    }
}
