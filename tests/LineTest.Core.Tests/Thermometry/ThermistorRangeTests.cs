using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ThermistorRangeTests
{
    [Fact]
    public void ZeroCelsiusK_IsExactSiValue()
    {
        // SI: 0 °C = 273.15 K exactly [published].
        Assert.Equal(273.15, ThermistorRange.ZeroCelsiusK);
    }

    [Theory]
    [InlineData(-300.0, 100.0)]
    [InlineData(50.0, 50.0)]
    [InlineData(double.NaN, 100.0)]
    public void AddRangeErrors_BadRange_NamesRange(double minC, double maxC)
    {
        var errors = new List<string>();

        ThermistorRange.AddRangeErrors(errors, minC, maxC);

        Assert.StartsWith("range:", Assert.Single(errors), StringComparison.Ordinal);
    }

    [Fact]
    public void AddRangeErrors_DefaultRange_AddsNothing()
    {
        var errors = new List<string>();

        ThermistorRange.AddRangeErrors(errors, ThermistorRange.DefaultMinC, ThermistorRange.DefaultMaxC);

        Assert.Empty(errors);
    }
}
