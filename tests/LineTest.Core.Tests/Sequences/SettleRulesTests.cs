using LineTest.Core.Definitions;
using LineTest.Core.Sequences;

namespace LineTest.Core.Tests.Sequences;

public sealed class SettleRulesTests
{
    private static readonly SequenceDefinition Sequence = new()
    {
        Id = "ctp40a-dac",
        Revision = 1,
        Product = "CTP-40A",
        SerialPattern = "^CTP40A-[0-9]{4}-[0-9]{6}$",
        Stability = new StabilitySettings { BandC = 0.05, MaxDriftCPerMinute = 0.02, WindowSeconds = 60, TimeoutSeconds = 1800 },
        Soak = new SoakSettings { MaxDriftCPerMinute = 0.05, WindowSeconds = 30, TimeoutSeconds = 900 },
        Setpoints = [new SetpointDefinition { Name = "cal-low", Celsius = 0 }, new SetpointDefinition { Name = "cal-high", Celsius = 85 }],
        Steps = [],
    };

    [Fact]
    public void Check_NoSettle_NoProblem()
    {
        var problems = new ProblemList();

        SettleRules.Check(Sequence, problems);

        Assert.Empty(problems.Items);
    }

    [Fact]
    public void Check_PredictiveWithAnUncertaintyInsideTheBand_NoProblem()
    {
        var problems = new ProblemList();

        SettleRules.Check(Sequence with { Settle = new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 } }, problems);

        Assert.Empty(problems.Items);
    }

    [Fact]
    public void Check_UnknownMode_IsRefusedAtItsPath()
    {
        var problems = new ProblemList();

        SettleRules.Check(Sequence with { Settle = new SettleSettings { Mode = "guess" } }, problems);

        var problem = Assert.Single(problems.Items);
        Assert.Equal("$.settle.mode", problem.Path);
        Assert.Equal("'guess' is not a settle mode: use \"window\" or \"predictive\"", problem.Reason);
    }

    [Fact]
    public void Check_PredictiveWithoutUncertainty_IsRefusedAtTheSetpointsPath()
    {
        var problems = new ProblemList();
        var setpoints = new[] { Sequence.Setpoints[0], Sequence.Setpoints[1] with { Settle = new SettleSettings { Mode = SettleModes.Predictive } } };

        SettleRules.Check(Sequence with { Setpoints = setpoints }, problems);

        Assert.Equal(["$.setpoints[1].settle.maxExtrapolationUncertaintyC"], problems.Items.Select(p => p.Path));
    }

    public static TheoryData<double, string> BadUncertainties => new()
    {
        { 0, "$.settle.maxExtrapolationUncertaintyC" },
        { -0.01, "$.settle.maxExtrapolationUncertaintyC" },
        { double.NaN, "$.settle.maxExtrapolationUncertaintyC" },
        { 0.05, "$.settle.maxExtrapolationUncertaintyC" },
    };

    [Theory]
    [MemberData(nameof(BadUncertainties))]
    public void Check_UncertaintyNotPositiveOrNotInsideTheBand_IsRefused(double u, string path)
    {
        var problems = new ProblemList();

        SettleRules.Check(Sequence with { Settle = new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = u } }, problems);

        Assert.Equal([path], problems.Items.Select(p => p.Path));
    }

    [Fact]
    public void For_SetpointWithItsOwnSettings_OverridesTheSequence()
    {
        var own = new SettleSettings { Mode = SettleModes.Window };
        var sequence = Sequence with
        {
            Settle = new SettleSettings { Mode = SettleModes.Predictive, MaxExtrapolationUncertaintyC = 0.01 },
            Setpoints = [Sequence.Setpoints[0] with { Settle = own }, Sequence.Setpoints[1]],
        };

        Assert.Same(own, SettleSettings.For(sequence, "cal-low"));
        Assert.Equal(SettleModes.Predictive, SettleSettings.For(sequence, "cal-high").Mode);
        Assert.Equal(SettleModes.Window, SettleSettings.For(Sequence, "cal-high").Mode);
    }
}
