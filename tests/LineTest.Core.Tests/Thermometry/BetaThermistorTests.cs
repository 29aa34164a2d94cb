using CsCheck;
using LineTest.Core.Thermometry;

namespace LineTest.Core.Tests.Thermometry;

public sealed class BetaThermistorTests
{
    // A common 10 kΩ, β = 3950 K NTC rating [common practice].
    private static readonly BetaThermistor Ntc = new(10000.0, 3950.0);

    [Theory]
    [InlineData(25.0, 10000.0)] // beta model: R(T0) = R25 by definition [published]
    [InlineData(0.0, 33620.604)] // 10000·exp(3950·(1/273.15 − 1/298.15)) [derived]
    [InlineData(100.0, 697.51977)] // 10000·exp(3950·(1/373.15 − 1/298.15)) [derived]
    public void FromCelsius_KnownPoints_MatchModel(double celsius, double expectedOhms)
    {
        Assert.Equal(expectedOhms, Ntc.FromCelsius(celsius).Value, expectedOhms * 1e-7);
    }

    [Theory]
    [InlineData(10000.0, 25.0)] // beta model at R25 [published]
    [InlineData(33620.604, 0.0)] // [derived] as above
    public void ToCelsius_KnownPoints_MatchModel(double ohms, double expectedC)
    {
        Assert.Equal(expectedC, Ntc.ToCelsius(ohms).Value, 1e-4);
    }

    [Fact]
    public void ToCelsius_RoundTripOverWholeRange_HoldsToBetterThanOneMillikelvin()
    {
        var gen = Gen.Select(Gen.Double[1000.0, 100000.0], Gen.Double[3000.0, 5000.0], Gen.Double[-50.0, 150.0]);
        gen.Sample((r25, beta, t) =>
        {
            var thermistor = new BetaThermistor(r25, beta);
            Assert.InRange(thermistor.ToCelsius(thermistor.FromCelsius(t).Value).Value - t, -1e-3, 1e-3);
        }, iter: 5000);
    }

    [Fact]
    public void ToCelsius_ResistanceOutsideRange_FailsNamingTheRange()
    {
        var result = Ntc.ToCelsius(1e7);

        Assert.False(result.IsSuccess);
        Assert.Contains("-50 to 150 °C", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void FromCelsius_TemperatureOutsideRange_Fails()
    {
        Assert.False(Ntc.FromCelsius(-60.0).IsSuccess);
    }

    [Theory]
    [InlineData(-30.0)]
    [InlineData(60.0)]
    public void SensitivityRawPerC_MatchesCentralDifference(double celsius)
    {
        const double h = 1e-4;
        var difference = (Ntc.ResistanceOhms(celsius + h) - Ntc.ResistanceOhms(celsius - h)) / (2 * h);

        Assert.Equal(difference, Ntc.SensitivityRawPerC(celsius), Math.Abs(difference) * 1e-6);
    }

    [Fact]
    public void Validate_BadFields_NameEachField()
    {
        var errors = BetaThermistor.Validate(-1.0, 0.0);

        Assert.Equal(2, errors.Count);
        Assert.StartsWith("r25:", errors[0], StringComparison.Ordinal);
        Assert.StartsWith("beta:", errors[1], StringComparison.Ordinal);
    }

    [Fact]
    public void Constructor_InvalidBeta_Throws()
    {
        Assert.Throws<ArgumentException>(() => new BetaThermistor(10000.0, double.NaN));
    }
}
