using LineTest.Core.Fixtures;
using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ReferenceSensorFactoryTests
{
    [Fact]
    public void Create_PrtWithOnlyR0_UsesIec60751Coefficients()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "prt", R0 = 100.0 });

        Assert.True(result.IsSuccess);
        var prt = Assert.IsType<PlatinumResistanceThermometer>(result.Sensor);
        Assert.Equal((PlatinumResistanceThermometer.IecA, PlatinumResistanceThermometer.IecB, PlatinumResistanceThermometer.IecC), (prt.A, prt.B, prt.C));

        // IEC 60751:2008 table, Pt100: 100 °C → 138.51 Ω [published].
        Assert.Equal(138.51, prt.FromCelsius(100.0).Value, 0.005);
    }

    [Fact]
    public void Create_PrtWithCertificateCoefficients_UsesThem()
    {
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "PRT", R0 = 100.012, A = 3.9092e-3, B = -5.81e-7, C = -4.3e-12 });

        var prt = Assert.IsType<PlatinumResistanceThermometer>(result.Sensor);
        Assert.Equal(100.012, prt.R0Ohms);
        Assert.Equal(3.9092e-3, prt.A);
        Assert.Equal(-4.3e-12, prt.C);
    }

    [Fact]
    public void Create_PrtWithoutR0_NamesR0()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "prt" });

        Assert.False(result.IsSuccess);
        Assert.StartsWith("r0:", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_PrtWithNegativeR0AndStrayFields_ListsEveryProblem()
    {
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "prt", R0 = -100.0, Beta = 3950.0, Type = "K" });

        Assert.False(result.IsSuccess);
        Assert.Collection(
            result.Errors,
            e => Assert.StartsWith("beta:", e, StringComparison.Ordinal),
            e => Assert.StartsWith("type:", e, StringComparison.Ordinal),
            e => Assert.StartsWith("r0:", e, StringComparison.Ordinal));
    }

    [Fact]
    public void Create_ThermistorSteinhartHart_BuildsIt()
    {
        // Published 10 kΩ NTC Steinhart–Hart set: 32 650.9 Ω ↔ 0.00 °C [published].
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "thermistor", A = 1.129148e-3, B = 2.34125e-4, C = 8.76741e-8 });

        var sensor = Assert.IsType<SteinhartHartThermistor>(result.Sensor);
        Assert.Equal(0.0, sensor.ToCelsius(32650.9).Value, 0.001);
    }

    [Fact]
    public void Create_ThermistorBeta_BuildsIt()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermistor", R25 = 10000.0, Beta = 3950.0 });

        var sensor = Assert.IsType<BetaThermistor>(result.Sensor);

        // Beta model: R(25 °C) = R25 by definition [published].
        Assert.Equal(25.0, sensor.ToCelsius(10000.0).Value, 1e-9);
    }

    [Fact]
    public void Create_ThermistorWithBothModels_NamesBothFieldSets()
    {
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "thermistor", A = 1e-3, B = 2e-4, C = 1e-7, R25 = 10000.0 });

        Assert.False(result.IsSuccess);
        Assert.Contains("r25", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_ThermistorWithPartialSteinhartHart_NamesMissingField()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermistor", A = 1e-3, B = 2e-4 });

        Assert.StartsWith("c:", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_ThermistorWithBadBeta_NamesBeta()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermistor", R25 = 10000.0, Beta = -1.0 });

        Assert.StartsWith("beta:", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_ThermistorWithoutCoefficients_SaysWhatIsNeeded()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermistor" });

        Assert.Contains("r25, beta", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_ThermocoupleTypeK_BuildsItWithColdJunction()
    {
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "thermocouple", Type = "k", ColdJunctionC = 22.5 });

        var sensor = Assert.IsType<Thermocouple>(result.Sensor);
        Assert.Equal(ThermocoupleType.K, sensor.Type);
        Assert.Equal(22.5, sensor.ColdJunctionC);
    }

    [Fact]
    public void Create_ThermocoupleWithoutColdJunction_DefaultsToZero()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermocouple", Type = "T" });

        // NIST Monograph 175 type T table: 350 °C → 17.819 mV with the reference junction at 0 °C [published].
        Assert.Equal(17.819, result.Sensor!.FromCelsius(350.0).Value, 0.0005);
    }

    [Theory]
    [InlineData(null, "type: required")]
    [InlineData("J", "type: 'J' is not a supported")]
    public void Create_ThermocoupleWithBadType_NamesType(string? type, string expected)
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "thermocouple", Type = type });

        Assert.StartsWith(expected, Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_ThermocoupleWithColdJunctionOutOfRange_NamesColdJunctionC()
    {
        var result = ReferenceSensorFactory.Create(
            new ReferenceSensorDefinition { Kind = "thermocouple", Type = "T", ColdJunctionC = 450.0 });

        Assert.StartsWith("coldJunctionC:", Assert.Single(result.Errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Create_Celsius_ReturnsIdentityReadout()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "celsius" });

        Assert.Same(CelsiusReadout.Instance, result.Sensor);
    }

    [Fact]
    public void Create_CelsiusWithCoefficients_NamesStrayFields()
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = "celsius", R0 = 100.0, ColdJunctionC = 0.0 });

        Assert.Equal(["r0: does not apply to kind 'celsius'; remove it", "coldJunctionC: does not apply to kind 'celsius'; remove it"], result.Errors);
    }

    [Theory]
    [InlineData("rtd")]
    [InlineData("")]
    public void Create_UnknownKind_NamesKindAndTheChoices(string kind)
    {
        var result = ReferenceSensorFactory.Create(new ReferenceSensorDefinition { Kind = kind });

        var error = Assert.Single(result.Errors);
        Assert.StartsWith("kind:", error, StringComparison.Ordinal);
        Assert.Contains("prt, thermistor, thermocouple, celsius", error, StringComparison.Ordinal);
    }
}
