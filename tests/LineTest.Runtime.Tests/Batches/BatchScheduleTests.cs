using LineTest.Core.Sequences;
using LineTest.Runtime.Batches;

namespace LineTest.Runtime.Tests.Batches;

public sealed class BatchScheduleTests
{
    [Fact]
    public void Baseline_ShippedSequenceAndFixture_SettlesForTheSlowestTravelPlusOneWindow()
    {
        var h = new CoordinatorHarness();

        var baseline = BatchSchedule.Baseline(h.Sequence, h.Fixture.Source);

        // [derived] the slowest leg is +40 → −20 °C at 10 °C/min with τ = 40 s and a 0.05 °C band: knee rτ = 6.667 °C,
        // t = (60 − 6.667)/(1/6) + 40·ln(6.667/0.05) = 320 + 195.66 = 515.66 s; plus the 60 s window, rounded up: 576 s.
        Assert.Equal(BatchScheduleKind.Baseline, baseline.Kind);
        Assert.Equal(576, baseline.FixedSettleSeconds);

        // Minimum soak 30 s plus one 30 s soak window.
        Assert.Equal(60, baseline.FixedSoakSeconds);
    }

    [Fact]
    public void Fast_IsTheDefaultOfABatchRequest()
    {
        var h = new CoordinatorHarness();

        var request = h.Request([]);

        Assert.Same(BatchSchedule.Fast, request.Schedule);
        Assert.Equal(BatchScheduleKind.Fast, request.Schedule.Kind);
    }

    [Fact]
    public void Baseline_NullSequence_Throws()
    {
        var h = new CoordinatorHarness();

        Assert.Throws<ArgumentNullException>(() => BatchSchedule.Baseline(null!, h.Fixture.Source));
        Assert.Throws<ArgumentNullException>(() => BatchSchedule.Baseline(h.Sequence with { SetpointOrder = SetpointOrders.Free }, null!));
    }
}
