using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class RangeTextTests
{
    [Theory]
    [InlineData(18.520059, "18.5201")]
    [InlineData(-200.0, "-200")]
    [InlineData(336103.2, "336103.2")]
    [InlineData(double.NaN, "NaN")]
    public void Number_FormatsInvariantlyToFourDecimals(double value, string expected)
    {
        Assert.Equal(expected, RangeText.Number(value));
    }

    [Fact]
    public void Exact_RoundTripsCoefficients()
    {
        Assert.Equal("8.76741E-08", RangeText.Exact(8.76741e-8));
    }

    [Fact]
    public void RawOutOfRange_NamesRawAndCelsiusRangeAndSensor()
    {
        var result = RangeText.RawOutOfRange(PlatinumResistanceThermometer.Pt100, "resistance", 10.0, 18.5201, 390.4811);

        Assert.Equal(
            "resistance 10 Ω is outside the valid range 18.5201 to 390.4811 Ω (-200 to 850 °C) of Pt100 (IEC 60751)",
            result.Error);
    }

    [Fact]
    public void Messages_UseOnlyCharactersLegacyConsolesShow()
    {
        // Station PCs may run a console on code page 437 or 850: both have ° and Ω, neither has … – or −.
        var messages = new[]
        {
            PlatinumResistanceThermometer.Pt100.ToCelsius(1.0).Error!,
            new SteinhartHartThermistor(1.129148e-3, 2.34125e-4, 8.76741e-8).FromCelsius(300.0).Error!,
            new Thermocouple(ThermocoupleType.K, 25.0).ToCelsius(99.0).Error!,
            string.Join(" ", ReferenceSensorFactory.Create(new() { Kind = "thermistor" }).Errors),
        };

        foreach (var message in messages)
        {
            Assert.All(message, ch => Assert.True(ch < 128 || ch is '°' or 'Ω', $"'{ch}' in \"{message}\""));
        }
    }
}
