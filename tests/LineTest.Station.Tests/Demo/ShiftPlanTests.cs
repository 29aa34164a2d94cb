using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Demo;

public sealed class ShiftPlanTests
{
    private static readonly DateTimeOffset Now = new(2026, 12, 3, 9, 40, 0, TimeSpan.Zero);

    // A 300-unit shift of four-unit batches at the ctp40a-dac dry-run batch time; three setpoints with 1,800 s settle and
    // 900 s soak timeouts.
    private static ShiftPlan Big => new() { Batches = 75, DryBatchSeconds = 1728.8, ReloadSeconds = 30, WorstOverrunSeconds = 3 * 2700 };

    [Fact]
    public void Start_EmptyFolderShortShift_SixInTheMorningAWeekBack()
    {
        var plan = Big with { Batches = 12 };

        Assert.Equal(new DateTimeOffset(2026, 11, 26, 6, 0, 0, TimeSpan.Zero), plan.Start(null, Now));
    }

    [Fact]
    public void Start_AfterStoredRuns_OneReloadGapLater()
    {
        var last = Now.AddDays(-2);

        Assert.Equal(last.AddSeconds(30), Big.Start(last, Now));
    }

    [Fact]
    public void Start_EmptyFolderLongShift_RoomForThreeShiftsThatRunAsPlannedOrFaster()
    {
        var plan = Big with { Batches = 250 };
        var start = plan.Start(null, Now);

        Assert.Equal(6, start.UtcDateTime.Hour);
        Assert.True(start < Now - TimeSpan.FromDays(7));
        for (var k = 0; k < ShiftPlan.ShiftsInEmptyFolder; k++)
        {
            Assert.True(plan.Fits(start, Now), $"shift {k + 1} does not fit");
            start = plan.Start(start + plan.Length, Now);
        }
    }

    [Fact]
    public void MayStartBatch_ShiftThatRunsToPlan_EveryBatchMayStart()
    {
        var plan = Big;
        var start = Now - plan.Needed;

        Assert.True(plan.Fits(start, Now));
        for (var b = 0; b < plan.Batches; b++)
        {
            Assert.True(plan.MayStartBatch(start + TimeSpan.FromSeconds(b * (plan.BatchSeconds + plan.ReloadSeconds)), Now), $"batch {b + 1}");
        }
    }

    [Fact]
    public void MayStartBatch_BatchThatCouldRunPastNow_IsRefused()
    {
        var plan = Big;
        var latest = Now - TimeSpan.FromSeconds(plan.BatchSeconds + plan.WorstOverrunSeconds);

        Assert.True(plan.MayStartBatch(latest, Now));
        Assert.False(plan.MayStartBatch(latest.AddSeconds(1), Now));
    }

    [Fact]
    public void UnitsThatFit_WholeBatchesBeforeNow()
    {
        var plan = Big;
        var start = Now - TimeSpan.FromSeconds(plan.WorstOverrunSeconds + (10 * plan.BatchSeconds) + (9 * plan.ReloadSeconds) + 60);

        Assert.Equal(40, plan.UnitsThatFit(start, Now, 4));
        Assert.Equal(0, plan.UnitsThatFit(Now, Now, 4));
    }

    [Fact]
    public async Task EstimateAsync_DemoSequence_PlansEachBatchAtLeastAtTheThermalBoundWithTheMargin()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null);

        var plan = await ShiftPlan.EstimateAsync(fixture, sequence.Value!, sequence.Sha256!, 10, 4, 4040, 30, CancellationToken.None);
        var dry = await DryRun.RunAsync(fixture, sequence.Value!, sequence.Sha256!, 4, 4040, CancellationToken.None);

        Assert.Equal(3, plan.Batches);
        Assert.Equal(Math.Max(dry.BatchSeconds, dry.Bound.BatchSeconds), plan.DryBatchSeconds);
        Assert.Equal(3 * (1800 + 900), plan.WorstOverrunSeconds);
        Assert.Equal((3 * plan.DryBatchSeconds * ShiftPlan.Margin) + (2 * 30), plan.Length.TotalSeconds, 3);
    }
}
