using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Steps;
using LineTest.Runtime.Tests.Batches;

namespace LineTest.Runtime.Tests.Steps;

public sealed class TrimInputsTests
{
    /// <summary>
    /// Regression: the budget over the rated range took each point's reference uncertainty from the last reading at that
    /// setpoint whose name ended in <c>.reference</c>; in the CTP-40 sequences the I–V sweep at +40 °C runs after the
    /// measure step there, so the point got the sweep's reference reading (other samples, another uncertainty).
    /// </summary>
    [Fact]
    public void PointReadings_SweepAfterTheMeasureAtAPoint_TakesTheMeasuresReadings()
    {
        var sequence = new CoordinatorHarness().Sequence;
        var step = sequence.Steps.OfType<TrimStep>().Single();
        var unit = new UnitContext(new SlotLoad(1, "CTP40A-2612-000001"), DateTimeOffset.UnixEpoch);
        unit.Readings.AddRange(
        [
            Read("iv-low.reference", "iv-low", "cal-low", 0.004),
            Read("cal-low.reference", "cal-low", "cal-low", 0.011),
            Read("cal-low.output", "cal-low", "cal-low", 0.00002),
            Read("cal-high.reference", "cal-high", "cal-high", 0.012),
            Read("cal-high.output", "cal-high", "cal-high", 0.00003),
            Read("iv-high.reference", "iv-high", "cal-high", 0.005),
        ]);

        var points = TrimInputs.PointReadings(sequence, step, unit);

        Assert.Equal(["cal-low", "cal-high"], step.Points);
        Assert.Equal(["cal-low.reference", "cal-high.reference"], points.Select(p => p.Reference!.Name));
        Assert.Equal(["cal-low.output", "cal-high.output"], points.Select(p => p.Output!.Name));
    }

    private static Reading Read(string name, string stepName, string setpoint, double u) =>
        new(name, 1.0, name.EndsWith(".output", StringComparison.Ordinal) ? "V" : "degC", null, null, Verdict.Pass)
        {
            Step = stepName, Setpoint = setpoint, StandardUncertainty = u,
        };
}
