using CsCheck;
using LineTest.Core.Thermometry;
using MathNet.Numerics.RootFinding;

namespace LineTest.Core.Tests.Thermometry;

public sealed class ThermocoupleReferenceFunctionTests
{
    // NIST ITS-90 Thermocouple Database (NIST Monograph 175), type K table, mV rounded to 0.001 [published].
    public static TheoryData<double, double> TypeKTable => new()
    {
        { -200.0, -5.891 },
        { -50.0, -1.889 },
        { 350.0, 14.293 },
        { 1372.0, 54.886 },
    };

    // NIST Monograph 175, type K table entries [from memory].
    public static TheoryData<double, double> TypeKTableFromMemory => new()
    {
        { -270.0, -6.458 },
        { -100.0, -3.554 },
        { 25.0, 1.000 },
        { 100.0, 4.096 },
        { 200.0, 8.138 },
        { 500.0, 20.644 },
        { 1000.0, 41.276 },
    };

    // NIST ITS-90 Thermocouple Database (NIST Monograph 175), type T table, mV rounded to 0.001 [published].
    public static TheoryData<double, double> TypeTTable => new()
    {
        { -200.0, -5.603 },
        { -50.0, -1.819 },
        { 350.0, 17.819 },
        { 400.0, 20.872 },
    };

    // NIST Monograph 175, type T table entries [from memory].
    public static TheoryData<double, double> TypeTTableFromMemory => new()
    {
        { -270.0, -6.258 },
        { -100.0, -3.379 },
        { 25.0, 0.992 },
        { 100.0, 4.279 },
        { 200.0, 9.288 },
        { 300.0, 14.862 },
    };

    [Theory]
    [MemberData(nameof(TypeKTable))]
    [MemberData(nameof(TypeKTableFromMemory))]
    public void EmfUnchecked_TypeKTable_MatchesWithinHalfAMicrovolt(double celsius, double tableMillivolts)
    {
        // NIST Monograph 175 type K table: compare with ±0.0005 mV (half the table's last digit).
        Assert.InRange(ThermocoupleReferenceFunction.TypeK.EmfUnchecked(celsius), tableMillivolts - 0.0005, tableMillivolts + 0.0005);
    }

    [Theory]
    [MemberData(nameof(TypeTTable))]
    [MemberData(nameof(TypeTTableFromMemory))]
    public void EmfUnchecked_TypeTTable_MatchesWithinHalfAMicrovolt(double celsius, double tableMillivolts)
    {
        // NIST Monograph 175 type T table: compare with ±0.0005 mV.
        Assert.InRange(ThermocoupleReferenceFunction.TypeT.EmfUnchecked(celsius), tableMillivolts - 0.0005, tableMillivolts + 0.0005);
    }

    [Theory]
    [MemberData(nameof(TypeKTable))]
    [MemberData(nameof(TypeKTableFromMemory))]
    public void TemperatureUnchecked_TypeKTableEmf_ReturnsTableTemperatureWithinRounding(double celsius, double tableMillivolts)
    {
        var function = ThermocoupleReferenceFunction.TypeK;

        // NIST Monograph 175 type K table: 0.0005 mV of table rounding is worth 0.0005/S(t) °C.
        var allowedC = (0.0005 / function.SeebeckMillivoltsPerC(celsius)) + 1e-6;
        Assert.InRange(function.TemperatureUnchecked(tableMillivolts), celsius - allowedC, celsius + allowedC);
    }

    [Theory]
    [MemberData(nameof(TypeTTable))]
    [MemberData(nameof(TypeTTableFromMemory))]
    public void TemperatureUnchecked_TypeTTableEmf_ReturnsTableTemperatureWithinRounding(double celsius, double tableMillivolts)
    {
        var function = ThermocoupleReferenceFunction.TypeT;

        // NIST Monograph 175 type T table: 0.0005 mV of table rounding is worth 0.0005/S(t) °C.
        var allowedC = (0.0005 / function.SeebeckMillivoltsPerC(celsius)) + 1e-6;
        Assert.InRange(function.TemperatureUnchecked(tableMillivolts), celsius - allowedC, celsius + allowedC);
    }

    [Fact]
    public void EmfUnchecked_AtZero_IsZeroForBothTypes()
    {
        // NIST Monograph 175: reference junction at 0 °C gives 0 mV; for type K the c0 term and the exponential
        // term cancel at 0 °C to within the printed digits of the coefficients [derived].
        Assert.Equal(0.0, ThermocoupleReferenceFunction.TypeK.EmfUnchecked(0.0), 1e-6);
        Assert.Equal(0.0, ThermocoupleReferenceFunction.TypeT.EmfUnchecked(0.0), 1e-12);
    }

    [Fact]
    public void SeebeckMillivoltsPerC_NearZero_IsAboutThirtyNineMicrovoltsPerDegree()
    {
        // NIST Monograph 175: c1 ≈ 0.0395 mV/°C (K, below 0 °C) and 0.0387 mV/°C (T) [published coefficients].
        Assert.Equal(0.0394501280250, ThermocoupleReferenceFunction.TypeK.SeebeckMillivoltsPerC(-1e-12), 1e-9);
        Assert.Equal(0.0387481063640, ThermocoupleReferenceFunction.TypeT.SeebeckMillivoltsPerC(0.0), 1e-12);
    }

    [Theory]
    [InlineData(ThermocoupleType.K, -260.0)]
    [InlineData(ThermocoupleType.K, -20.0)]
    [InlineData(ThermocoupleType.K, 127.0)]
    [InlineData(ThermocoupleType.K, 900.0)]
    [InlineData(ThermocoupleType.T, -150.0)]
    [InlineData(ThermocoupleType.T, 250.0)]
    public void SeebeckMillivoltsPerC_MatchesCentralDifference(ThermocoupleType type, double celsius)
    {
        var function = ThermocoupleReferenceFunction.For(type);
        const double h = 1e-3;

        var difference = (function.EmfUnchecked(celsius + h) - function.EmfUnchecked(celsius - h)) / (2 * h);

        Assert.Equal(difference, function.SeebeckMillivoltsPerC(celsius), 1e-8);
    }

    [Theory]
    [InlineData(ThermocoupleType.K)]
    [InlineData(ThermocoupleType.T)]
    public void SeebeckMillivoltsPerC_WholeRange_StaysPositive(ThermocoupleType type)
    {
        // The numerical inverse relies on E(t) rising strictly; the smallest slope is at −270 °C.
        var function = ThermocoupleReferenceFunction.For(type);
        for (var t = function.MinC; t <= function.MaxC; t += 0.25)
        {
            Assert.True(function.SeebeckMillivoltsPerC(t) > 5e-4, $"slope at {t} °C");
        }
    }

    [Fact]
    public void TemperatureUnchecked_AgreesWithBrentRootOfTheReferenceFunction()
    {
        // Independent reference: MathNet.Numerics' Brent root finder on the same NIST reference function.
        var function = ThermocoupleReferenceFunction.TypeK;
        foreach (var millivolts in new[] { -6.45, -5.0, -0.5, 0.3, 10.0, 33.3, 54.8 })
        {
            var low = millivolts < 0 ? function.MinC : 0.0;
            var high = millivolts < 0 ? 0.0 : function.MaxC;
            var reference = Brent.FindRoot(t => function.EmfUnchecked(t) - millivolts, low, high, 1e-11, 500);

            Assert.Equal(reference, function.TemperatureUnchecked(millivolts), 1e-7);
        }
    }

    // The full ranges, down to −270 °C, invert well: the Seebeck coefficient there is small (about 0.7 µV/°C for K,
    // 1.0 µV/°C for T) but 1 mK needs the emf only to about 1e-6 mV, ten orders above double rounding.
    [Theory]
    [InlineData(ThermocoupleType.K)]
    [InlineData(ThermocoupleType.T)]
    public void TemperatureUnchecked_RoundTripOverWholeRange_HoldsToBetterThanOneMillikelvin(ThermocoupleType type)
    {
        var function = ThermocoupleReferenceFunction.For(type);
        Gen.Double[function.MinC, function.MaxC].Sample(
            t => Math.Abs(function.TemperatureUnchecked(function.EmfUnchecked(t)) - t) < 1e-3,
            iter: 5000);
    }

    [Theory]
    [InlineData(ThermocoupleType.K, -270.0)]
    [InlineData(ThermocoupleType.K, 0.0)]
    [InlineData(ThermocoupleType.K, 1372.0)]
    [InlineData(ThermocoupleType.T, -270.0)]
    [InlineData(ThermocoupleType.T, 400.0)]
    public void TemperatureUnchecked_RangeEnds_RoundTrip(ThermocoupleType type, double celsius)
    {
        var function = ThermocoupleReferenceFunction.For(type);

        Assert.Equal(celsius, function.TemperatureUnchecked(function.EmfUnchecked(celsius)), 1e-6);
    }

    [Fact]
    public void Ranges_AreThoseOfNistMonograph175()
    {
        // NIST Monograph 175: type K −270 to 1372 °C, type T −270 to 400 °C [published].
        Assert.Equal((-270.0, 1372.0), (ThermocoupleReferenceFunction.TypeK.MinC, ThermocoupleReferenceFunction.TypeK.MaxC));
        Assert.Equal((-270.0, 400.0), (ThermocoupleReferenceFunction.TypeT.MinC, ThermocoupleReferenceFunction.TypeT.MaxC));
        Assert.True(ThermocoupleReferenceFunction.TypeK.Contains(1372.0));
        Assert.False(ThermocoupleReferenceFunction.TypeT.Contains(400.1));
    }
}
