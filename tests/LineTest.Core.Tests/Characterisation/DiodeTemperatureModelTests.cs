using LineTest.Core.Characterisation;

namespace LineTest.Core.Tests.Characterisation;

public sealed class DiodeTemperatureModelTests
{
    private const double K = 1.380649e-23;
    private const double Q = 1.602176634e-19;
    private const double T1 = 298.15;

    public static TheoryData<double, double, double> Parts => new()
    {
        { 1.0, 3.0, 1.12 },
        { 1.05, 3.0, 1.12 },
        { 1.1, 2.8, 1.13 },
    };

    [Theory]
    [MemberData(nameof(Parts))]
    public void ForwardVolts_AnyTemperature_EqualsShockleyWithSaturationCurrentLaw(double n, double xti, double eg)
    {
        // Shockley: V_f = n·(kT/q)·ln(I/I_s); saturation-current law I_s(T) = I_s(T1)·(T/T1)^XTI·exp(−(q·EG/(n·k))·(1/T − 1/T1))
        // (the junction diode's temperature law as in semiconductor-device textbooks, e.g. Sze, Physics of Semiconductor
        // Devices, and the SPICE diode model's temperature equations with XTI_SPICE = n·XTI [from memory]).
        const double amps = 10e-6;
        const double isAtT1 = 2e-15;
        double Shockley(double kelvin)
        {
            var saturation = isAtT1 * Math.Pow(kelvin / T1, xti) * Math.Exp(-(Q * eg / (n * K)) * ((1 / kelvin) - (1 / T1)));
            return n * K * kelvin / Q * Math.Log(amps / saturation);
        }

        foreach (var kelvin in new[] { 233.15, 253.15, 278.15, 313.15, 333.15, 373.15 })
        {
            Assert.Equal(Shockley(kelvin), DiodeTemperatureModel.ForwardVolts(kelvin, T1, Shockley(T1), eg, xti, n), 12);
        }
    }

    [Fact]
    public void ForwardVolts_SpiceSaturationLaw_SameCurveWithXtiTimesN()
    {
        // SPICE: IS(T) = IS·(T/TNOM)^(XTI/N)·exp((T/TNOM − 1)·EG/(N·V_T(T))) [from memory: the Berkeley SPICE diode model].
        const double n = 1.05;
        const double xtiSpice = 3.0;
        const double eg = 1.11;
        const double amps = 10e-6;
        double Spice(double kelvin)
        {
            var vt = K * kelvin / Q;
            var saturation = 1e-15 * Math.Pow(kelvin / T1, xtiSpice / n) * Math.Exp(((kelvin / T1) - 1) * eg / (n * vt));
            return n * vt * Math.Log(amps / saturation);
        }

        Assert.Equal(Spice(253.15), DiodeTemperatureModel.ForwardVolts(253.15, T1, Spice(T1), eg, xtiSpice / n, n), 12);
        Assert.Equal(Spice(333.15), DiodeTemperatureModel.ForwardVolts(333.15, T1, Spice(T1), eg, xtiSpice / n, n), 12);
    }

    [Fact]
    public void SlopeVoltsPerKelvin_TypicalSiliconDiode_AboutMinusTwoMillivoltsPerDegree()
    {
        // A silicon diode's forward voltage at constant current falls by about 2 mV/°C [common practice].
        var slope = DiodeTemperatureModel.SlopeVoltsPerKelvin(T1, T1, 0.600, 1.12, 3.0, 1.05);

        Assert.InRange(slope * 1000, -2.2, -1.8);
    }

    [Fact]
    public void SlopeVoltsPerKelvin_Anywhere_EqualsDerivativeOfForwardVolts()
    {
        foreach (var kelvin in new[] { 243.15, 283.15, 323.15 })
        {
            const double h = 1e-3;
            var numeric = (DiodeTemperatureModel.ForwardVolts(kelvin + h, T1, 0.6, 1.12, 3, 1.05)
                - DiodeTemperatureModel.ForwardVolts(kelvin - h, T1, 0.6, 1.12, 3, 1.05)) / (2 * h);
            Assert.Equal(numeric, DiodeTemperatureModel.SlopeVoltsPerKelvin(kelvin, T1, 0.6, 1.12, 3, 1.05), 9);
        }
    }

    [Fact]
    public void CurvatureVolts_ChordMinusTwentyToForty_BowsAboutFourTenthsOfAMillivolt()
    {
        // Second derivative of −XTI·n·(k/q)·T·ln(T/T1) is −XTI·n·(k/q)/T, so the curve departs from its chord over a span
        // L by about |f''|·L²/8 = 3·1.05·86.17 µV/K / 283 K · (60 K)² / 8 ≈ 0.43 mV in the middle [derived].
        double V(double celsius) => DiodeTemperatureModel.ForwardVolts(celsius + 273.15, T1, 0.6, 1.12, 3, 1.05);
        var chordAt10 = (V(-20) + V(40)) / 2;

        // Concave (f'' < 0): the curve lies above its chord.
        var bow = V(10) - chordAt10;

        Assert.InRange(bow * 1000, 0.41, 0.45);
    }

    [Fact]
    public void ForwardVolts_BandGap_EntersOnlyAStraightLine()
    {
        // d²V_f/dT² does not depend on EG: two band gaps differ by a straight line in T.
        double Difference(double kelvin) => DiodeTemperatureModel.ForwardVolts(kelvin, T1, 0.6, 1.20, 3, 1.05) - DiodeTemperatureModel.ForwardVolts(kelvin, T1, 0.6, 1.10, 3, 1.05);
        var mid = (Difference(253.15) + Difference(313.15)) / 2;

        Assert.Equal(Difference(283.15), mid, 12);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-5.0)]
    [InlineData(double.NaN)]
    public void ForwardVolts_NotAboveAbsoluteZero_Throws(double kelvin)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => DiodeTemperatureModel.ForwardVolts(kelvin, T1, 0.6, 1.12, 3, 1));
    }
}
