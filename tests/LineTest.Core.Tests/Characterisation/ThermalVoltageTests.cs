using LineTest.Core.Characterisation;

namespace LineTest.Core.Tests.Characterisation;

public sealed class ThermalVoltageTests
{
    [Theory]
    // SI 2019 exact constants k = 1.380649e-23 J/K, e = 1.602176634e-19 C: kT/q = 25.852 mV at 300 K and
    // 25.693 mV at 298.15 K [published constants; derived voltages].
    [InlineData(300.0, 25.852e-3)]
    [InlineData(298.15, 25.693e-3)]
    public void AtKelvin_PublishedTemperatures_MatchPublishedThermalVoltage(double kelvin, double expectedVolts)
    {
        Assert.Equal(expectedVolts, ThermalVoltage.AtKelvin(kelvin), 6);
    }

    [Fact]
    public void AtCelsius_TwentyFiveDegrees_EqualsAtKelvin29815()
    {
        // 25 °C = 298.15 K by the definition of the Celsius scale (SI Brochure, 9th edition, §2.3.1) [published definition].
        Assert.Equal(ThermalVoltage.AtKelvin(298.15), ThermalVoltage.AtCelsius(25.0), 15);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-1.0)]
    [InlineData(double.NaN)]
    public void AtKelvin_NotAboveAbsoluteZero_Throws(double kelvin)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => ThermalVoltage.AtKelvin(kelvin));
    }
}
