using CsCheck;
using LineTest.Core.Thermometry;
using MathNet.Numerics.RootFinding;

namespace LineTest.Core.Tests.Thermometry;

public sealed class PlatinumResistanceThermometerTests
{
    // IEC 60751:2008 table, Pt100, resistance rounded to 0.01 Ω [published].
    public static TheoryData<double, double> Pt100Table => new()
    {
        { -200.0, 18.52 },
        { -50.0, 80.31 },
        { -40.0, 84.27 },
        { 0.0, 100.00 },
        { 50.0, 119.40 },
        { 100.0, 138.51 },
        { 150.0, 157.33 },
        { 200.0, 175.86 },
        { 400.0, 247.09 },
    };

    // IEC 60751 Pt100 table entries [from memory]; agree with the Callendar–Van Dusen equation.
    public static TheoryData<double, double> Pt100TableFromMemory => new()
    {
        { -100.0, 60.26 },
        { 300.0, 212.05 },
        { 500.0, 280.98 },
        { 850.0, 390.48 },
    };

    [Theory]
    [MemberData(nameof(Pt100Table))]
    [MemberData(nameof(Pt100TableFromMemory))]
    public void FromCelsius_Pt100TableTemperature_MatchesTableToHundredthOhm(double celsius, double tableOhms)
    {
        var ohms = PlatinumResistanceThermometer.Pt100.FromCelsius(celsius).Value;

        // IEC 60751:2008 table [published]: the table is rounded to 0.01 Ω, so it holds within half a step.
        Assert.InRange(ohms, tableOhms - 0.005, tableOhms + 0.005);
    }

    // The same table without −200 °C: its rounded 18.52 Ω lies just below R(−200 °C) = 18.5201 Ω.
    public static TheoryData<double, double> Pt100TableInsideRange => new()
    {
        { -50.0, 80.31 },
        { -40.0, 84.27 },
        { 0.0, 100.00 },
        { 50.0, 119.40 },
        { 100.0, 138.51 },
        { 150.0, 157.33 },
        { 200.0, 175.86 },
        { 400.0, 247.09 },
    };

    [Theory]
    [MemberData(nameof(Pt100TableInsideRange))]
    [MemberData(nameof(Pt100TableFromMemory))]
    public void ToCelsius_Pt100TableResistance_ReturnsTableTemperatureWithinRounding(double celsius, double tableOhms)
    {
        var pt100 = PlatinumResistanceThermometer.Pt100;

        var result = pt100.ToCelsius(tableOhms).Value;

        // IEC 60751:2008 table [published]: 0.005 Ω of table rounding is worth 0.005/(dR/dt) °C.
        var allowedC = (0.005 / pt100.SensitivityRawPerC(celsius)) + 1e-6;
        Assert.InRange(result, celsius - allowedC, celsius + allowedC);
    }

    [Theory]
    [InlineData(100.0, 138.5055)] // R(100 °C), IEC 60751:2008 coefficients, unrounded [derived]
    [InlineData(-200.0, 18.5201)] // R(−200 °C), IEC 60751:2008 coefficients incl. C term, unrounded [derived]
    [InlineData(50.0, 119.3971)] // R(50 °C), IEC 60751:2008 coefficients, unrounded [derived]
    public void FromCelsius_Pt100_MatchesUnroundedEquationValue(double celsius, double expectedOhms)
    {
        var ohms = PlatinumResistanceThermometer.Pt100.FromCelsius(celsius).Value;

        Assert.Equal(expectedOhms, ohms, 0.00006);
    }

    [Theory]
    [InlineData(138.5055, 100.0)] // IEC 60751:2008 equation, unrounded [derived]
    [InlineData(18.5201, -200.0)] // IEC 60751:2008 equation, unrounded [derived]
    [InlineData(119.3971, 50.0)] // IEC 60751:2008 equation, unrounded [derived]
    public void ToCelsius_Pt100UnroundedResistance_ReturnsTemperatureWithinAMillikelvin(double ohms, double expectedC)
    {
        var celsius = PlatinumResistanceThermometer.Pt100.ToCelsius(ohms).Value;

        Assert.Equal(expectedC, celsius, 0.001);
    }

    [Theory]
    [InlineData(-200.0, 185.201)] // IEC 60751:2008 equation, R0 = 1000 Ω, unrounded [derived]
    [InlineData(0.0, 1000.0)] // IEC 60751:2008, R0 of a Pt1000 [published]
    [InlineData(100.0, 1385.055)] // IEC 60751:2008 equation, R0 = 1000 Ω, unrounded [derived]
    [InlineData(400.0, 2470.92)] // IEC 60751:2008 equation, R0 = 1000 Ω, unrounded [derived]
    public void FromCelsius_Pt1000_MatchesEquationValue(double celsius, double expectedOhms)
    {
        var ohms = PlatinumResistanceThermometer.Pt1000.FromCelsius(celsius).Value;

        Assert.Equal(expectedOhms, ohms, 0.0006);
    }

    [Fact]
    public void Constants_EquivalentAlphaDeltaBeta_MatchIec60751()
    {
        // IEC 60751:2008: α = A + 100·B = 0.00385055, δ = −1e4·B/α = 1.49979, β = −1e8·C/α = 0.10863 [derived].
        var alpha = PlatinumResistanceThermometer.IecA + (100 * PlatinumResistanceThermometer.IecB);
        Assert.Equal(0.00385055, alpha, 1e-9);
        Assert.Equal(1.49979, -1e4 * PlatinumResistanceThermometer.IecB / alpha, 1e-5);
        Assert.Equal(0.10863, -1e8 * PlatinumResistanceThermometer.IecC / alpha, 1e-5);
    }

    [Fact]
    public void ToCelsius_BelowZero_AgreesWithBrentRootOfTheEquation()
    {
        // Independent reference: MathNet.Numerics' Brent root finder on the same IEC 60751 equation.
        var pt100 = PlatinumResistanceThermometer.Pt100;
        foreach (var ohms in new[] { 18.6, 25.0, 40.0, 60.0, 80.0, 95.0, 99.99 })
        {
            var reference = Brent.FindRoot(t => pt100.ResistanceOhms(t) - ohms, -200.0, 0.0, 1e-12, 200);

            Assert.Equal(reference, pt100.ToCelsius(ohms).Value, 1e-9);
        }
    }

    [Fact]
    public void ToCelsius_Pt100RoundTripOverWholeRange_HoldsToBetterThanOneMillikelvin()
    {
        var pt100 = PlatinumResistanceThermometer.Pt100;
        Gen.Double[PlatinumResistanceThermometer.RangeMinC, PlatinumResistanceThermometer.RangeMaxC].Sample(
            t => Math.Abs(pt100.ToCelsius(pt100.FromCelsius(t).Value).Value - t) < 1e-3,
            iter: 5000);
    }

    [Fact]
    public void ToCelsius_Pt1000RoundTripOverWholeRange_HoldsToBetterThanOneMillikelvin()
    {
        var pt1000 = PlatinumResistanceThermometer.Pt1000;
        Gen.Double[PlatinumResistanceThermometer.RangeMinC, PlatinumResistanceThermometer.RangeMaxC].Sample(
            t => Math.Abs(pt1000.ToCelsius(pt1000.FromCelsius(t).Value).Value - t) < 1e-3,
            iter: 5000);
    }

    [Fact]
    public void ToCelsius_CustomCertificateRoundTrip_HoldsToBetterThanOneMillikelvin()
    {
        // Certificate coefficients differ slightly from the standard ones; the inverse must still be exact.
        var gen = Gen.Select(
            Gen.Double[50.0, 2000.0],
            Gen.Double[3.85e-3, 3.95e-3],
            Gen.Double[-6.2e-7, -5.4e-7],
            Gen.Double[-4.6e-12, -3.8e-12],
            Gen.Double[-200.0, 850.0]);
        gen.Sample((r0, a, b, c, t) =>
        {
            var prt = new PlatinumResistanceThermometer(r0, a, b, c);
            Assert.InRange(prt.ToCelsius(prt.FromCelsius(t).Value).Value - t, -1e-3, 1e-3);
        }, iter: 2000);
    }

    [Theory]
    [InlineData(-200.0)]
    [InlineData(0.0)]
    [InlineData(850.0)]
    public void ToCelsius_RangeEnds_RoundTripExactly(double celsius)
    {
        var pt100 = PlatinumResistanceThermometer.Pt100;

        Assert.Equal(celsius, pt100.ToCelsius(pt100.FromCelsius(celsius).Value).Value, 1e-9);
    }

    [Fact]
    public void ToCelsius_RoundedTableValueJustBelowRange_FailsRatherThanExtrapolating()
    {
        // IEC 60751:2008 table, Pt100: −200 °C → 18.52 Ω [published], rounded below R(−200 °C) = 18.5201 Ω [derived].
        var result = PlatinumResistanceThermometer.Pt100.ToCelsius(18.52);

        Assert.False(result.IsSuccess);
        Assert.Contains("18.5201", result.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(18.0)]
    [InlineData(391.0)]
    [InlineData(-5.0)]
    public void ToCelsius_ResistanceOutsideRange_FailsNamingTheRange(double ohms)
    {
        var result = PlatinumResistanceThermometer.Pt100.ToCelsius(ohms);

        Assert.False(result.IsSuccess);
        Assert.Contains("18.5201 to 390.4811 Ω", result.Error, StringComparison.Ordinal);
        Assert.Contains("-200 to 850 °C", result.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(-200.01)]
    [InlineData(850.5)]
    public void FromCelsius_TemperatureOutsideRange_FailsNamingTheRange(double celsius)
    {
        var result = PlatinumResistanceThermometer.Pt100.FromCelsius(celsius);

        Assert.False(result.IsSuccess);
        Assert.Contains("-200 to 850 °C", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void ToCelsius_NotANumber_Fails()
    {
        Assert.False(PlatinumResistanceThermometer.Pt100.ToCelsius(double.NaN).IsSuccess);
        Assert.False(PlatinumResistanceThermometer.Pt100.FromCelsius(double.PositiveInfinity).IsSuccess);
    }

    [Theory]
    [InlineData(-150.0)]
    [InlineData(-0.5)]
    [InlineData(0.5)]
    [InlineData(420.0)]
    public void SensitivityRawPerC_MatchesCentralDifference(double celsius)
    {
        var pt100 = PlatinumResistanceThermometer.Pt100;
        const double h = 1e-3;

        var difference = (pt100.ResistanceOhms(celsius + h) - pt100.ResistanceOhms(celsius - h)) / (2 * h);

        Assert.Equal(difference, pt100.SensitivityRawPerC(celsius), 1e-6);
    }

    [Fact]
    public void SensitivityRawPerC_Pt100AtZero_IsAboutPointThreeNineOhmPerDegree()
    {
        // IEC 60751:2008: dR/dt at 0 °C = R0·A = 0.39083 Ω/°C [derived].
        Assert.Equal(0.39083, PlatinumResistanceThermometer.Pt100.SensitivityRawPerC(0.0), 1e-9);
    }

    [Fact]
    public void Name_StandardAndCustom_SayWhichModel()
    {
        Assert.Equal("Pt100 (IEC 60751)", PlatinumResistanceThermometer.Pt100.Name);
        Assert.Equal("Pt1000 (IEC 60751)", PlatinumResistanceThermometer.Pt1000.Name);
        Assert.Contains("Callendar", new PlatinumResistanceThermometer(100.0, 3.9e-3).Name, StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_NegativeR0_NamesR0()
    {
        var errors = PlatinumResistanceThermometer.Validate(-100.0, PlatinumResistanceThermometer.IecA, PlatinumResistanceThermometer.IecB, PlatinumResistanceThermometer.IecC);

        Assert.StartsWith("r0:", Assert.Single(errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_NonFiniteCoefficient_NamesThatCoefficient()
    {
        var errors = PlatinumResistanceThermometer.Validate(100.0, PlatinumResistanceThermometer.IecA, double.NaN, PlatinumResistanceThermometer.IecC);

        Assert.StartsWith("b:", Assert.Single(errors), StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_SlopeTurnsNegativeInRange_NamesCoefficientsAndTemperature()
    {
        // A + 2·B·t < 0 before 850 °C: resistance would fall again, and the inverse would be ambiguous.
        var errors = PlatinumResistanceThermometer.Validate(100.0, 3.9e-3, -5e-6, PlatinumResistanceThermometer.IecC);

        var error = Assert.Single(errors);
        Assert.StartsWith("a, b, c:", error, StringComparison.Ordinal);
        Assert.Contains("850 °C", error, StringComparison.Ordinal);
    }

    [Fact]
    public void Constructor_InvalidCoefficients_Throws()
    {
        Assert.Throws<ArgumentException>(() => new PlatinumResistanceThermometer(0.0));
    }

    [Fact]
    public void RawUnit_IsOhm()
    {
        Assert.Equal(RawUnits.Ohm, PlatinumResistanceThermometer.Pt100.RawUnit);
        Assert.Equal(-200.0, PlatinumResistanceThermometer.Pt100.MinC);
        Assert.Equal(850.0, PlatinumResistanceThermometer.Pt100.MaxC);
    }
}
