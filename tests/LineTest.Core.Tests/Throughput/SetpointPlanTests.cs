using LineTest.TestSupport;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Tests.TestData;
using LineTest.Core.Throughput;

namespace LineTest.Core.Tests.Throughput;

public sealed class SetpointPlanTests
{
    // The shipped sequence: identify, supply, settle cal-low (-20 °C), measure, settle cal-high (+40 °C), measure, trim,
    // settle verify (+5 °C), verify. The shipped source ramps up at 15 °C/min, down at 10 °C/min, τ = 40 s.
    private static readonly FixtureDefinition Fixture = LoadFixture();
    private static readonly SequenceDefinition Shipped = LoadSequence();

    [Fact]
    public void Order_FixedSequence_ReturnsTheStepsUnchanged()
    {
        var fixedOrder = Shipped with { SetpointOrder = SetpointOrders.Fixed };

        var steps = SetpointPlan.Order(fixedOrder, Fixture.Source, 23);

        Assert.Same(fixedOrder.Steps, steps);
    }

    [Fact]
    public void Order_FreeFromStandby_VisitsCalHighFirstAndKeepsVerifyAfterTrim()
    {
        // [derived] from 23 °C: cal-low first travels 43 °C down + 60 up + 35 down; cal-high first 17 up + 60 down
        // + 25 up. With the travel model t = |Δ|/r − τ + τ·ln(rτ/band) per leg, the second is 1028 s against 1191 s.
        var steps = SetpointPlan.Order(Shipped, Fixture.Source, 23);

        Assert.Equal(["cal-high", "cal-low", "verify"], steps.OfType<SettleStep>().Select(s => s.Setpoint));
        Assert.Equal(Shipped.Steps.Count, steps.Count);
        Assert.True(IndexOf<TrimStep>(steps) < IndexOf<VerifyStep>(steps));
        Assert.IsType<MeasureStep>(steps[IndexOfSettle(steps, "cal-high") + 1]);
        Assert.Equal("cal-high", ((MeasureStep)steps[IndexOfSettle(steps, "cal-high") + 1]).Setpoint);
    }

    [Fact]
    public void Order_FreeFromTheVerifyTemperature_KeepsFileOrder()
    {
        // [derived] from +5 °C both orders travel 60 °C up and 60 °C down in total; file order has two downward legs
        // and one upward, whose fixed per-leg terms (155.6 s down, 171.9 s up) make it 17 s shorter.
        var steps = SetpointPlan.Order(Shipped, Fixture.Source, 5);

        Assert.Equal(["cal-low", "cal-high", "verify"], steps.OfType<SettleStep>().Select(s => s.Setpoint));
    }

    [Fact]
    public void Order_FreeAnyStart_ChoosesTheLeastTravelOfEveryPermutation()
    {
        // Property: whatever the start, the chosen order's travel is no longer than the file order's or the reverse.
        foreach (var start in new[] { -30.0, -20, -5, 0, 5, 10, 23, 40, 60, 125 })
        {
            var chosen = Travel(SetpointPlan.Order(Shipped, Fixture.Source, start), start);
            var fileOrder = Travel(Shipped.Steps, start);
            var reversed = Travel(SetpointPlan.Order(Shipped with { Steps = Swap(Shipped.Steps) }, Fixture.Source, start), start);

            Assert.True(chosen <= fileOrder + 1e-9, $"start {start}: {chosen} > {fileOrder}");
            Assert.True(chosen <= reversed + 1e-9, $"start {start}: {chosen} > {reversed}");
        }
    }

    [Fact]
    public void Apply_FreeSequence_GivesALowerOrEqualThermalBound()
    {
        var planned = SetpointPlan.Apply(Shipped, Fixture.Source, 23);

        var plannedBound = ThermalBound.Compute(planned, Fixture.Source, 23, 4, 1.0, 0.2);
        var fileBound = ThermalBound.Compute(Shipped, Fixture.Source, 23, 4, 1.0, 0.2);

        Assert.True(plannedBound.BatchSeconds < fileBound.BatchSeconds);
    }

    [Fact]
    public void Order_SeparatedBlocks_AreNotReordered()
    {
        // A prompt between the two calibration blocks makes them separate groups of one: nothing may move.
        var steps = Shipped.Steps.ToList();
        steps.Insert(IndexOfSettle(steps, "cal-high"), new PromptStep { Text = "Check the lid.", Confirm = false });
        var separated = Shipped with { Steps = steps };

        var ordered = SetpointPlan.Order(separated, Fixture.Source, 23);

        Assert.Equal(steps, ordered);
    }

    [Fact]
    public void Order_EightBlocks_UsesNearestFirstAndKeepsEveryStep()
    {
        var setpoints = Enumerable.Range(0, 8).Select(i => new SetpointDefinition { Name = $"p{i}", Celsius = -20 + (i * 3 % 8) * 10 }).ToList();
        var steps = new List<StepDefinition>();
        foreach (var p in setpoints)
        {
            steps.Add(new SettleStep { Setpoint = p.Name });
            steps.Add(new MeasureStep { Name = p.Name, Setpoint = p.Name, Samples = 2 });
        }

        var sequence = Shipped with { Setpoints = setpoints, Steps = steps };

        var ordered = SetpointPlan.Order(sequence, Fixture.Source, -20);

        var temperatures = ordered.OfType<SettleStep>().Select(s => setpoints.Single(p => p.Name == s.Setpoint).Celsius).ToList();
        Assert.Equal(temperatures.Order(), temperatures);
        Assert.Equal(steps.Count, ordered.Count);
    }

    // Found when the three-point resistor sequence was tried with "setpointOrder": "free": its third point is measured
    // in a block at the verify setpoint, then the trim and verify follow with no settle of their own. The planner moved
    // that block away from the end of the group, so the trim and verify ran at -20 °C while verify reported +5 °C.
    [Fact]
    public void Order_ReaderAfterTheGroupWithoutItsOwnSettle_ItsBlockStaysLast()
    {
        var threePoint = LoadSequence("ctp40r-resistor-3pt.json") with { SetpointOrder = SetpointOrders.Free };

        foreach (var start in new[] { -30.0, -20, -5, 0, 5, 10, 23, 40, 60, 125 })
        {
            var ordered = SetpointPlan.Order(threePoint, Fixture.Source, start);

            Assert.Equal(threePoint.Steps.Count, ordered.Count);
            AssertEveryReadingAtItsSettle(ordered, $"start {start}");
            Assert.Equal("verify", ordered.OfType<SettleStep>().Last().Setpoint);
        }
    }

    [Fact]
    public void Order_ShippedSequencesMadeFree_EveryReadingAtItsSettle()
    {
        // Property: whatever the start, a step that reads at a setpoint runs after a settle at that setpoint and before
        // any other settle, for every shipped sequence with its blocks set free.
        foreach (var file in Directory.GetFiles(Path.GetDirectoryName(TestFiles.ShippedSequencePath)!, "ctp40*.json"))
        {
            var free = LoadSequence(Path.GetFileName(file)) with { SetpointOrder = SetpointOrders.Free };
            foreach (var start in new[] { -30.0, -20, 5, 23, 40, 125 })
            {
                AssertEveryReadingAtItsSettle(SetpointPlan.Order(free, Fixture.Source, start), $"{Path.GetFileName(file)} from {start}");
            }
        }
    }

    private static void AssertEveryReadingAtItsSettle(IReadOnlyList<StepDefinition> steps, string what)
    {
        string? at = null;
        foreach (var step in steps)
        {
            var kind = LineTest.Core.Sequences.Steps.StepKinds.Of(step);
            if (kind?.PlannerRole == LineTest.Core.Sequences.Steps.PlannerRole.Settle)
            {
                at = kind.SetpointOf(step);
            }
            else if (kind?.SetpointOf(step) is { } reads)
            {
                Assert.True(reads == at, $"{what}: {step.GetType().Name} '{step.Name}' reads at '{reads}' while the block was last settled at '{at}'");
            }
        }
    }

    private static double Travel(IReadOnlyList<StepDefinition> steps, double startC)
    {
        var total = 0.0;
        var at = startC;
        foreach (var settle in steps.OfType<SettleStep>())
        {
            var to = Shipped.Setpoints.Single(s => s.Name == settle.Setpoint).Celsius;
            total += ThermalBound.TravelSeconds(Fixture.Source, at, to, Shipped.Stability.BandC);
            at = to;
        }

        return total;
    }

    private static List<StepDefinition> Swap(IReadOnlyList<StepDefinition> steps)
    {
        var list = steps.ToList();
        var low = IndexOfSettle(list, "cal-low");
        var high = IndexOfSettle(list, "cal-high");
        var lowBlock = list.GetRange(low, high - low);
        list.RemoveRange(low, high - low);
        list.InsertRange(low + 2, lowBlock);
        return list;
    }

    private static int IndexOfSettle(IReadOnlyList<StepDefinition> steps, string setpoint) =>
        steps.Select((s, i) => (s, i)).First(x => x.s is SettleStep settle && settle.Setpoint == setpoint).i;

    private static int IndexOf<T>(IReadOnlyList<StepDefinition> steps) => steps.Select((s, i) => (s, i)).First(x => x.s is T).i;

    private static FixtureDefinition LoadFixture()
    {
        var result = DefinitionFile.Fixture(TestFiles.ShippedFixturePath);
        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        return result.Value!;
    }

    private static SequenceDefinition LoadSequence(string file)
    {
        var result = DefinitionFile.Sequence(Path.Combine(Path.GetDirectoryName(TestFiles.ShippedSequencePath)!, file), LoadFixture());
        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        return result.Value!;
    }

    private static SequenceDefinition LoadSequence()
    {
        // The resistor sequence: its calibration blocks are settle + measure only, so a free order may swap them.
        // (The DAC sequence also sweeps the diode in those blocks, and a temperature-coefficient sweep needs the
        // other sweep before it, so its blocks are not independent and keep file order.)
        var result = DefinitionFile.Sequence(Path.Combine(Path.GetDirectoryName(TestFiles.ShippedSequencePath)!, "ctp40r-resistor.json"), LoadFixture());
        Assert.True(result.IsSuccess, string.Join(Environment.NewLine, result.Problems));
        Assert.Equal(SetpointOrders.Free, result.Value!.SetpointOrder);
        return result.Value;
    }
}
