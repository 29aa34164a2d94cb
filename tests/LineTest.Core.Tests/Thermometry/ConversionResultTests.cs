using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ConversionResultTests
{
    [Fact]
    public void Success_CarriesValueAndNoError()
    {
        var result = ConversionResult.Success(12.5);

        Assert.True(result.IsSuccess);
        Assert.Equal(12.5, result.Value);
        Assert.Null(result.Error);
        Assert.True(result.TryGetValue(out var value));
        Assert.Equal(12.5, value);
    }

    [Fact]
    public void Failure_CarriesErrorAndValueThrows()
    {
        var result = ConversionResult.Failure("resistance out of range");

        Assert.False(result.IsSuccess);
        Assert.Equal("resistance out of range", result.Error);
        Assert.False(result.TryGetValue(out _));
        var exception = Assert.Throws<InvalidOperationException>(() => result.Value);
        Assert.Contains("resistance out of range", exception.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Default_IsAFailureNotAZero()
    {
        var result = default(ConversionResult);

        Assert.False(result.IsSuccess);
        Assert.NotNull(result.Error);
    }

    [Fact]
    public void Failure_BlankMessage_Throws()
    {
        Assert.Throws<ArgumentException>(() => ConversionResult.Failure(" "));
    }

    [Fact]
    public void Equality_ComparesOutcomeAndContent()
    {
        Assert.Equal(ConversionResult.Success(1.0), ConversionResult.Success(1.0));
        Assert.NotEqual(ConversionResult.Success(1.0), ConversionResult.Success(2.0));
        Assert.True(ConversionResult.Failure("x") == ConversionResult.Failure("x"));
        Assert.True(ConversionResult.Failure("x") != ConversionResult.Success(1.0));
    }
}
