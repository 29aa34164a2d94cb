using LineTest.Core.Results;
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
