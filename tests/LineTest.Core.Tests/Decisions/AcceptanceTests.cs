using LineTest.Core.Decisions;
using LineTest.Core.Results;

namespace LineTest.Core.Tests.Decisions;

public sealed class AcceptanceTests
{
    // Tolerance ±2.0 °C; U = 0.5 °C → guarded acceptance limits ±1.5 °C (binary-exact numbers).
    private static readonly LimitSpec Guarded = new() { Low = -2.0, High = 2.0, Unit = "degC", Rule = DecisionRule.Guarded };
    private static readonly LimitSpec Simple = new() { Low = -2.0, High = 2.0, Unit = "degC" };

    public static TheoryData<double, Verdict> GuardedCases => new()
    {
        // ILAC G8:09/2019 §4.2.2: AL = TL ± w, w = r·U with r = 1.
        { 1.5, Verdict.Pass },       // at the upper acceptance limit
        { 1.4999, Verdict.Pass },    // just inside
        { 1.5001, Verdict.Fail },    // just outside, though inside the tolerance
        { -1.5, Verdict.Pass },      // at the lower acceptance limit
        { -1.4999, Verdict.Pass },
        { -1.5001, Verdict.Fail },
        { 0.0, Verdict.Pass },
        { 2.5, Verdict.Fail },
    };

    [Theory]
    [MemberData(nameof(GuardedCases))]
    public void Decide_Guarded_AcceptsUpToTheGuardBandedLimit(double value, Verdict expected)
    {
        var decision = Acceptance.Decide(value, Guarded, expandedUncertainty: 0.5);

        Assert.Equal(expected, decision.Verdict);
        Assert.Equal(-1.5, decision.AcceptanceLow);
        Assert.Equal(1.5, decision.AcceptanceHigh);
        Assert.Equal(0.5, decision.GuardBand);
        Assert.Equal("guarded", decision.Rule);
    }

    [Fact]
    public void Decide_GuardedFactorHalf_MovesLimitsByHalfU()
    {
        // ILAC G8:09/2019 §4.2.2: w = r·U; r = 0.5, U = 0.5 → w = 0.25, AL = 1.75.
        var decision = Acceptance.Decide(1.7, Guarded with { GuardBandFactor = 0.5 }, 0.5);

        Assert.Equal(Verdict.Pass, decision.Verdict);
        Assert.Equal(1.75, decision.AcceptanceHigh);
    }

    [Theory]
    [InlineData(2.0, Verdict.Pass)]
    [InlineData(1.9, Verdict.Pass)]
    [InlineData(2.0001, Verdict.Fail)]
    [InlineData(-2.0001, Verdict.Fail)]
    public void Decide_Simple_AcceptsUpToTheToleranceLimitAndIgnoresU(double value, Verdict expected)
    {
        // ILAC G8:09/2019 §4.2.1: simple acceptance, w = 0.
        var decision = Acceptance.Decide(value, Simple, expandedUncertainty: 0.5);

        Assert.Equal(expected, decision.Verdict);
        Assert.Equal(2.0, decision.AcceptanceHigh);
        Assert.Equal(0.0, decision.GuardBand);
        Assert.Equal("simple", decision.Rule);
    }

    [Fact]
    public void Decide_UpperLimitOnly_JudgesOnlyTheUpperSide()
    {
        var limits = new LimitSpec { High = 50, Unit = "mA", Rule = DecisionRule.Guarded };

        Assert.Equal(Verdict.Pass, Acceptance.Decide(-1000, limits, 1).Verdict);
        Assert.Equal(Verdict.Pass, Acceptance.Decide(49, limits, 1).Verdict);
        var fail = Acceptance.Decide(49.5, limits, 1);
        Assert.Equal(Verdict.Fail, fail.Verdict);
        Assert.Null(fail.AcceptanceLow);
        Assert.Equal(49, fail.AcceptanceHigh);
        Assert.Contains("above the acceptance limit 49 mA", fail.Note);
    }

    [Fact]
    public void Decide_LowerLimitOnly_JudgesOnlyTheLowerSide()
    {
        var limits = new LimitSpec { Low = 4.5, Unit = "V" };

        Assert.Equal(Verdict.Pass, Acceptance.Decide(1e6, limits).Verdict);
        var fail = Acceptance.Decide(4.4, limits);
        Assert.Equal(Verdict.Fail, fail.Verdict);
        Assert.Null(fail.AcceptanceHigh);
        Assert.Contains("below the limit 4.5 V", fail.Note);
    }

    [Fact]
    public void Decide_GuardedWithoutUncertainty_IsAnError()
    {
        var decision = Acceptance.Decide(0, Guarded);

        Assert.Equal(Verdict.Error, decision.Verdict);
        Assert.Contains("expanded uncertainty", decision.Note);
    }

    [Fact]
    public void Decide_NoValue_IsAnError()
    {
        Assert.Equal(Verdict.Error, Acceptance.Decide(null, Simple).Verdict);
        Assert.Equal(Verdict.Error, Acceptance.Decide(double.NaN, Simple).Verdict);
    }

    [Fact]
    public void Decide_GuardBandWiderThanHalfTheTolerance_FailsEverything()
    {
        var decision = Acceptance.Decide(0, Guarded, expandedUncertainty: 2.5);

        Assert.Equal(Verdict.Fail, decision.Verdict);
        Assert.Contains("no acceptance zone", decision.Note);
    }

    [Fact]
    public void Decide_LowAboveHigh_IsAnErrorNamingTheFields()
    {
        var decision = Acceptance.Decide(0, new LimitSpec { Low = 1, High = -1, Unit = "V" });

        Assert.Equal(Verdict.Error, decision.Verdict);
        Assert.Contains("low (1) is above high (-1)", decision.Note);
    }
}
