using LineTest.Core.Calibration;

namespace LineTest.Core.Tests.Calibration;

public sealed class CalculationResultTests
{
    [Fact]
    public void Value_OnFailure_ThrowsWithTheReason()
    {
        var result = CalculationResult<string>.Failure("no points");

        var ex = Assert.Throws<InvalidOperationException>(() => result.Value);
        Assert.Contains("no points", ex.Message);
        Assert.False(result.TryGetValue(out _));
    }

    [Fact]
    public void Then_OnFailure_PassesTheReasonOn()
    {
        var result = CalculationResult<string>.Failure("no points").Then(s => CalculationResult<string>.Success(s + "!"));

        Assert.Equal("no points", result.Reason);
    }

    [Fact]
    public void Then_OnSuccess_AppliesTheNextStep()
    {
        var result = CalculationResult<string>.Success("a").Then(s => CalculationResult<string>.Success(s + "b"));

        Assert.True(result.TryGetValue(out var value));
        Assert.Equal("ab", value);
    }
}
