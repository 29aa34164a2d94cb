using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class CelsiusReadoutTests
{
    [Theory]
    [InlineData(-38.8344)] // ITS-90 Table 1, triple point of mercury [published]
    [InlineData(0.01)] // ITS-90 Table 1, triple point of water [published]
    [InlineData(29.7646)] // ITS-90 Table 1, melting point of gallium [published]
    [InlineData(156.5985)] // ITS-90 Table 1, freezing point of indium [published]
    public void ToCelsiusAndFromCelsius_ReturnTheReadingUnchanged(double celsius)
    {
        Assert.Equal(celsius, CelsiusReadout.Instance.ToCelsius(celsius).Value);
        Assert.Equal(celsius, CelsiusReadout.Instance.FromCelsius(celsius).Value);
    }

    [Fact]
    public void ToCelsius_BelowAbsoluteZero_FailsNamingTheRange()
    {
        var result = CelsiusReadout.Instance.ToCelsius(-300.0);

        Assert.False(result.IsSuccess);
        Assert.Contains("-273.15 to 1372 °C", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void ToCelsius_NotANumber_Fails()
    {
        Assert.False(CelsiusReadout.Instance.ToCelsius(double.NaN).IsSuccess);
    }

    [Fact]
    public void SensitivityRawPerC_IsOne()
    {
        Assert.Equal(1.0, CelsiusReadout.Instance.SensitivityRawPerC(50.0));
        Assert.Equal(RawUnits.Celsius, CelsiusReadout.Instance.RawUnit);
    }
}
