using CsCheck;
using LineTest.Core.Thermometry;
using MathNet.Numerics.RootFinding;

namespace LineTest.Core.Tests.Thermometry;

public sealed class SteinhartHartThermistorTests
{
    // A widely published 10 kΩ NTC Steinhart–Hart coefficient set [published].
    private const double A = 1.129148e-3;
    private const double B = 2.34125e-4;
    private const double C = 8.76741e-8;

    private static readonly SteinhartHartThermistor Ntc = new(A, B, C);

    // The same published 10 kΩ NTC set: resistance ↔ temperature within 0.001 °C [published].
    public static TheoryData<double, double> PublishedPoints => new()
    {
        { 32650.9, 0.00 },
        { 97006.9, -20.00 },
        { 336103.2, -40.00 },
    };

    [Theory]
    [MemberData(nameof(PublishedPoints))]
    public void ToCelsius_PublishedResistance_ReturnsPublishedTemperature(double ohms, double expectedC)
    {
        Assert.Equal(expectedC, Ntc.ToCelsius(ohms).Value, 0.001);
    }

    [Theory]
    [MemberData(nameof(PublishedPoints))]
    public void FromCelsius_PublishedTemperature_ReturnsPublishedResistanceWithinAMillikelvin(double expectedOhms, double celsius)
    {
        var ohms = Ntc.FromCelsius(celsius).Value;

        // 0.001 °C expressed in Ω through the local slope dR/dT.
        var allowedOhms = 0.001 * Math.Abs(Ntc.SensitivityRawPerC(celsius));
        Assert.InRange(ohms, expectedOhms - allowedOhms, expectedOhms + allowedOhms);
    }

    [Fact]
    public void FromCelsius_TwentyFiveDegrees_IsNearTenKiloohm()
    {
        // A 10 kΩ NTC is 10 kΩ at 25 °C by definition of its rating [common practice]; the fit holds it within 0.001 °C.
        var allowedOhms = 0.001 * Math.Abs(Ntc.SensitivityRawPerC(25.0));
        Assert.InRange(Ntc.FromCelsius(25.0).Value, 10000.0 - allowedOhms, 10000.0 + allowedOhms);
    }

    [Fact]
    public void FromCelsius_AgreesWithBrentRootOfTheEquation()
    {
        // Independent reference: MathNet.Numerics' Brent root finder on 1/T = A + B·L + C·L³ for L = ln R.
        foreach (var celsius in new[] { -50.0, -12.5, 0.0, 37.0, 85.0, 150.0 })
        {
            var inverseK = 1.0 / (celsius + 273.15);
            var logR = Brent.FindRoot(l => A + (B * l) + (C * l * l * l) - inverseK, 0.0, 30.0, 1e-14, 200);

            Assert.Equal(Math.Exp(logR), Ntc.FromCelsius(celsius).Value, Math.Exp(logR) * 1e-10);
        }
    }

    [Fact]
    public void ToCelsius_RoundTripOverWholeRange_HoldsToBetterThanOneMillikelvin()
    {
        Gen.Double[ThermistorRange.DefaultMinC, ThermistorRange.DefaultMaxC].Sample(
            t => Math.Abs(Ntc.ToCelsius(Ntc.FromCelsius(t).Value).Value - t) < 1e-3,
            iter: 5000);
    }

    [Fact]
    public void FromCelsius_OtherCoefficientSetsRoundTrip_HoldsToBetterThanOneMillikelvin()
    {
        // Includes C = 0 (a two-term fit), where the cubic degenerates to a line.
        var gen = Gen.Select(
            Gen.Double[0.8e-3, 1.5e-3],
            Gen.Double[2.0e-4, 3.0e-4],
            Gen.OneOf(Gen.Const(0.0), Gen.Double[1e-9, 2e-7]),
            Gen.Double[-50.0, 150.0]);
        gen.Sample((a, b, c, t) =>
        {
            var thermistor = new SteinhartHartThermistor(a, b, c);
            Assert.InRange(thermistor.ToCelsius(thermistor.FromCelsius(t).Value).Value - t, -1e-3, 1e-3);
        }, iter: 2000);
    }

    [Fact]
    public void ToCelsius_ResistanceOutsideRange_FailsNamingTheRange()
    {
        var result = Ntc.ToCelsius(100.0);

        Assert.False(result.IsSuccess);
        Assert.Contains("-50 to 150 °C", result.Error, StringComparison.Ordinal);
        Assert.Contains("Ω", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void FromCelsius_TemperatureOutsideRange_FailsNamingTheRange()
    {
        var result = Ntc.FromCelsius(151.0);

        Assert.False(result.IsSuccess);
        Assert.Contains("-50 to 150 °C", result.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(-40.0)]
    [InlineData(25.0)]
    [InlineData(120.0)]
    public void SensitivityRawPerC_MatchesCentralDifference(double celsius)
    {
        const double h = 1e-4;
        var difference = (Ntc.ResistanceOhms(celsius + h) - Ntc.ResistanceOhms(celsius - h)) / (2 * h);

        Assert.Equal(difference, Ntc.SensitivityRawPerC(celsius), Math.Abs(difference) * 1e-6);
        Assert.True(Ntc.SensitivityRawPerC(celsius) < 0, "an NTC's resistance falls as it warms");
    }

    [Fact]
    public void Validate_NonPositiveB_NamesB()
    {
        Assert.StartsWith("b:", Assert.Single(SteinhartHartThermistor.Validate(A, 0.0, C)), StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_NegativeC_NamesC()
    {
        Assert.StartsWith("c:", Assert.Single(SteinhartHartThermistor.Validate(A, B, -1e-7)), StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_ReversedRange_NamesRange()
    {
        Assert.StartsWith("range:", Assert.Single(SteinhartHartThermistor.Validate(A, B, C, 100.0, 0.0)), StringComparison.Ordinal);
    }

    [Fact]
    public void Constructor_CustomRange_NarrowsValidRange()
    {
        var narrow = new SteinhartHartThermistor(A, B, C, 0.0, 50.0);

        Assert.False(narrow.FromCelsius(-10.0).IsSuccess);
        Assert.True(narrow.FromCelsius(10.0).IsSuccess);
        Assert.Equal(RawUnits.Ohm, narrow.RawUnit);
    }
}
