using LineTest.Core.Decisions;
using LineTest.Core.Results;

namespace LineTest.Core.Tests.Decisions;

public sealed class ReadingFactoryTests
{
    [Fact]
    public void Create_GuardedReading_RecordsLimitsUncertaintyAndRule()
    {
        var limits = new LimitSpec { Low = -0.5, High = 0.5, Unit = "degC", Rule = DecisionRule.Guarded };
        var uncertainty = new ExpandedUncertainty(0.0625, 2);

        var reading = ReadingFactory.Create("verify.error", 0.4, limits, uncertainty, samples: 10);

        // U = 2·0.0625 = 0.125 → acceptance limits ±0.375; 0.4 is inside tolerance but outside acceptance.
        Assert.Equal(Verdict.Fail, reading.Verdict);
        Assert.Equal("degC", reading.Unit);
        Assert.Equal(-0.5, reading.Low);
        Assert.Equal(0.5, reading.High);
        Assert.Equal(-0.375, reading.AcceptanceLow);
        Assert.Equal(0.375, reading.AcceptanceHigh);
        Assert.Equal(0.0625, reading.StandardUncertainty);
        Assert.Equal(0.125, reading.ExpandedUncertainty);
        Assert.Equal(2, reading.CoverageFactor);
        Assert.Equal("guarded", reading.DecisionRule);
        Assert.Equal(10, reading.Samples);
        Assert.NotNull(reading.Note);
    }

    [Fact]
    public void Create_SimplePass_HasNoNote()
    {
        var reading = ReadingFactory.Create("supply.current", 12.0, new LimitSpec { High = 20, Unit = "mA" });

        Assert.Equal(Verdict.Pass, reading.Verdict);
        Assert.Null(reading.Note);
        Assert.Null(reading.StandardUncertainty);
        Assert.Equal("simple", reading.DecisionRule);
    }

    [Fact]
    public void Create_NaNValue_StoresNoValueAndError()
    {
        var reading = ReadingFactory.Create("supply.current", double.NaN, new LimitSpec { High = 20, Unit = "mA" });

        Assert.Null(reading.Value);
        Assert.Equal(Verdict.Error, reading.Verdict);
    }

    [Fact]
    public void Create_InfiniteUncertainty_ErrorReadingInsteadOfException()
    {
        // Regression: found by fuzzing, samples whose uncertainty overflowed made Acceptance.Decide throw.
        var limits = new LimitSpec { Low = -0.5, High = 0.5, Unit = "degC", Rule = DecisionRule.Guarded };

        var reading = ReadingFactory.Create("verify.error", 0.1, limits, new ExpandedUncertainty(double.PositiveInfinity, 2), 10);

        Assert.Equal(Verdict.Error, reading.Verdict);
        Assert.Contains("could not be evaluated", reading.Note, StringComparison.Ordinal);
    }
}
