using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

public sealed class StatisticOutcomeTests
{
    [Fact]
    public void NotComputed_CarriesReasonAndNoValue()
    {
        var outcome = StatisticOutcome<string>.NotComputed("too few values");
        Assert.False(outcome.IsComputed);
        Assert.Null(outcome.Value);
        Assert.Equal("too few values", outcome.Reason);
    }

    [Fact]
    public void Computed_CarriesValueAndNoReason()
    {
        var outcome = StatisticOutcome<string>.Computed("x");
        Assert.True(outcome.IsComputed);
        Assert.Equal("x", outcome.Value);
        Assert.Null(outcome.Reason);
    }

    [Fact]
    public void NotComputed_BlankReason_Throws()
    {
        Assert.Throws<ArgumentException>(() => StatisticOutcome<string>.NotComputed(" "));
    }
}
