using System.Reflection;
using System.Text.Json.Serialization;
using LineTest.Core.Sequences;
using LineTest.Core.Sequences.Steps;

namespace LineTest.Core.Tests.Sequences.Steps;

public sealed class StepKindsTests
{
    /// <summary>Every step kind the JSON reader knows: the <c>[JsonDerivedType]</c> lines on <see cref="StepDefinition"/>.</summary>
    public static IReadOnlyList<JsonDerivedTypeAttribute> JsonKinds { get; } =
        typeof(StepDefinition).GetCustomAttributes<JsonDerivedTypeAttribute>().ToList();

    [Fact]
    public void All_EveryJsonDerivedStepKind_HasOneDescriptor()
    {
        var described = StepKinds.All.Select(k => k.StepType).ToList();

        Assert.NotEmpty(JsonKinds);
        Assert.Equal(described.Count, described.Distinct().Count());
        Assert.Equal(JsonKinds.Select(k => k.DerivedType).OrderBy(t => t.Name), described.OrderBy(t => t.Name));
    }

    [Fact]
    public void All_EveryDescriptor_UsesTheJsonKindWordOfItsStep()
    {
        foreach (var json in JsonKinds)
        {
            var kind = StepKinds.All.Single(k => k.StepType == json.DerivedType);
            Assert.Equal(json.TypeDiscriminator, kind.Word);
        }
    }

    [Fact]
    public void Of_StepOfEachKind_ReturnsItsDescriptorAndScreenWords()
    {
        StepDefinition[] steps =
        [
            new IdentifyStep(),
            new SettleStep { Setpoint = "cal-low" },
            new MeasureStep { Setpoint = "cal-low" },
            new TrimStep { Points = ["cal-low", "cal-high"] },
            new PromptStep { Text = "Close the lid" },
            new IvSweepStep { Setpoint = "cal-low" },
        ];

        foreach (var step in steps)
        {
            var kind = StepKinds.Of(step);
            Assert.Equal(step.Kind, kind.Word);
            Assert.False(string.IsNullOrWhiteSpace(kind.DoingText(step)));
        }

        Assert.Equal("measuring at cal-low", StepKinds.Of(steps[2]).DoingText(steps[2]));
    }

    [Fact]
    public void Of_PlannerRoles_SettleStartsBlocksMeasureMovesWithThemTrimIsNeverCrossed()
    {
        Assert.Equal(PlannerRole.Settle, StepKinds.Of(new SettleStep { Setpoint = "a" }).PlannerRole);
        Assert.Equal(PlannerRole.ReadsInBlock, StepKinds.Of(new MeasureStep { Setpoint = "a" }).PlannerRole);
        Assert.Equal(PlannerRole.Barrier, StepKinds.Of(new TrimStep { Points = ["a", "b"] }).PlannerRole);
        Assert.Equal(PlannerRole.Barrier, StepKinds.Of(new IvSweepStep { Setpoint = "a" }).PlannerRole);
        Assert.Equal("a", StepKinds.SetpointOf(new IvSweepStep { Setpoint = "a" }));
        Assert.Null(StepKinds.SetpointOf(new IdentifyStep()));
    }

    [Fact]
    public void EstimateSeconds_IvSweep_EachUnitReadsTheReferenceTwiceAndEveryCurrent()
    {
        // [derived] from the sweep executor's pacing: per unit, one reference reading before and one after, and one
        // meter-paced SMU reading per current and sample: 4 × (2 × 1 s + 7 × 2 × 0.2 s) = 19.2 s.
        var sweep = new IvSweepStep { Setpoint = "a", FromAmps = 1e-6, ToAmps = 1e-3, Points = 7, Samples = 2 };

        var seconds = StepKinds.Of(sweep).EstimateSeconds(sweep, new StepTimeModel(4, 1.0, 0.2));

        Assert.Equal(19.2, seconds, 9);
    }
}
