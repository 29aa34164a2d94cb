using CsCheck;
using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ThermocoupleTests
{
    [Fact]
    public void ToCelsius_TypeKWithColdJunctionAt25_SubtractsTheColdJunctionEmf()
    {
        // NIST Monograph 175 type K table [from memory]: E(100 °C) = 4.096 mV, E(25 °C) = 1.000 mV, so a junction
        // at 100 °C read against a 25 °C cold junction gives 3.096 mV.
        var thermocouple = new Thermocouple(ThermocoupleType.K, 25.0);

        var celsius = thermocouple.ToCelsius(3.096).Value;

        // ±0.001 mV of table rounding (two entries) over S(100 °C) ≈ 0.0415 mV/°C.
        Assert.Equal(100.0, celsius, 0.025);
    }

    [Fact]
    public void FromCelsius_TypeTWithColdJunctionAt25_IsTableDifference()
    {
        // NIST Monograph 175 type T table: E(350 °C) = 17.819 mV [published], E(25 °C) = 0.992 mV [from memory].
        var thermocouple = new Thermocouple(ThermocoupleType.T, 25.0);

        Assert.Equal(17.819 - 0.992, thermocouple.FromCelsius(350.0).Value, 0.001);
    }

    [Fact]
    public void FromCelsius_AtColdJunctionTemperature_IsZero()
    {
        var thermocouple = new Thermocouple(ThermocoupleType.K, 23.4);

        Assert.Equal(0.0, thermocouple.FromCelsius(23.4).Value, 1e-15);
        Assert.Equal(23.4, thermocouple.ToCelsius(0.0).Value, 1e-9);
    }

    [Theory]
    [InlineData(ThermocoupleType.K)]
    [InlineData(ThermocoupleType.T)]
    public void ToCelsius_RoundTripWithAnyColdJunction_HoldsToBetterThanOneMillikelvin(ThermocoupleType type)
    {
        var function = ThermocoupleReferenceFunction.For(type);
        var gen = Gen.Select(Gen.Double[-20.0, 60.0], Gen.Double[function.MinC, function.MaxC]);
        gen.Sample((coldJunctionC, t) =>
        {
            var thermocouple = new Thermocouple(type, coldJunctionC);
            Assert.InRange(thermocouple.ToCelsius(thermocouple.FromCelsius(t).Value).Value - t, -1e-3, 1e-3);
        }, iter: 3000);
    }

    [Fact]
    public void ToCelsius_EmfAboveRange_FailsNamingMillivoltAndCelsiusRange()
    {
        var thermocouple = new Thermocouple(ThermocoupleType.T);

        var result = thermocouple.ToCelsius(21.0);

        Assert.False(result.IsSuccess);
        Assert.Contains("-6.2575 to 20.872 mV", result.Error, StringComparison.Ordinal);
        Assert.Contains("-270 to 400 °C", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void ToCelsius_ColdJunctionShiftsTheMillivoltRange()
    {
        // With the cold junction at 25 °C the top of type T is E(400) − E(25) = 20.872 − 0.992 mV [derived].
        var thermocouple = new Thermocouple(ThermocoupleType.T, 25.0);

        Assert.Equal(20.872 - 0.992, thermocouple.MaxMillivolts, 0.001);
        Assert.True(thermocouple.ToCelsius(19.87).IsSuccess);
        Assert.False(thermocouple.ToCelsius(19.89).IsSuccess);
    }

    [Fact]
    public void FromCelsius_TemperatureOutsideRange_FailsNamingTheRange()
    {
        var result = new Thermocouple(ThermocoupleType.K).FromCelsius(1400.0);

        Assert.False(result.IsSuccess);
        Assert.Contains("-270 to 1372 °C", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void ToCelsius_NotANumber_Fails()
    {
        Assert.False(new Thermocouple(ThermocoupleType.K).ToCelsius(double.NaN).IsSuccess);
    }

    [Fact]
    public void Validate_ColdJunctionOutsideTypeRange_NamesColdJunctionC()
    {
        var errors = Thermocouple.Validate(ThermocoupleType.T, 500.0);

        Assert.StartsWith("coldJunctionC:", Assert.Single(errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_UndefinedType_NamesType()
    {
        Assert.StartsWith("type:", Assert.Single(Thermocouple.Validate((ThermocoupleType)7, 0.0)), StringComparison.Ordinal);
    }

    [Fact]
    public void SensitivityRawPerC_IsTheSeebeckCoefficient()
    {
        var thermocouple = new Thermocouple(ThermocoupleType.K, 30.0);

        Assert.Equal(ThermocoupleReferenceFunction.TypeK.SeebeckMillivoltsPerC(500.0), thermocouple.SensitivityRawPerC(500.0));
        Assert.Equal(RawUnits.Millivolt, thermocouple.RawUnit);
    }
}
