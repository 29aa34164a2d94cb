using LineTest.Core.Characterisation;

namespace LineTest.Core.Tests.Characterisation;

public sealed class ForwardVoltageTemperatureTests
{
    // Silicon band gap ≈ 1.12 eV near room temperature; I_s ∝ T³·exp(−E_g/(n·k·T)) [from memory].
    private const double BandGapVolts = 1.12;
    private const double T0 = 300.15;

    [Fact]
    public void Compute_JunctionFollowingTheSaturationCurrentLaw_GivesChordSlopeAndBandGapIntercept()
    {
        const double n = 1.05;
        const double rs = 20;
        const double bias = 10e-6;
        var (t1, t2) = (-20.0, 40.0);
        var first = FitAt(t1, n, rs);
        var second = FitAt(t2, n, rs);

        var result = ForwardVoltageTemperature.Compute(first, t1, second, t2, bias).Value;

        // Oracle: the same law evaluated directly at the bias current.
        var v1 = Forward(t1, n, rs, bias);
        var v2 = Forward(t2, n, rs, bias);
        Assert.Equal(v1, result.FirstVolts, 8);
        Assert.Equal(v2, result.SecondVolts, 8);
        Assert.Equal((v2 - v1) / 60.0, result.SlopeVoltsPerC, 10);
        Assert.Equal(v1 - (result.SlopeVoltsPerC * (t1 + 273.15)), result.ZeroKelvinVolts, 8);

        // A silicon diode's forward voltage falls by about 2 mV/°C [common practice], and the 0 K intercept of the
        // chord lies a little above E_g/q (the T³ law of I_s bends V_f(T) slightly) [from memory].
        Assert.InRange(result.SlopeVoltsPerC, -2.6e-3, -1.5e-3);
        Assert.InRange(result.ZeroKelvinVolts, BandGapVolts, BandGapVolts + 0.1);
    }

    [Fact]
    public void Compute_SweepsTooCloseInTemperature_Fails()
    {
        var a = FitAt(25, 1.05, 20);
        var b = FitAt(27, 1.05, 20);

        var result = ForwardVoltageTemperature.Compute(a, 25, b, 27, 10e-6);

        Assert.False(result.Succeeded);
        Assert.Contains("only 2 °C apart", result.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Compute_NonPositiveBias_Fails()
    {
        var a = FitAt(-20, 1.05, 20);
        var b = FitAt(40, 1.05, 20);

        Assert.False(ForwardVoltageTemperature.Compute(a, -20, b, 40, 0).Succeeded);
    }

    /// <summary>I_s(T) = I_s(T0)·(T/T0)^(3/n)·exp(−(E_g/(n·V_T))·(1 − T/T0)), the usual junction law.</summary>
    private static double SaturationAmps(double celsius, double n)
    {
        var kelvin = celsius + 273.15;
        var vt = 1.380649e-23 * kelvin / 1.602176634e-19;
        return 2.2e-15 * Math.Pow(kelvin / T0, 3 / n) * Math.Exp(-(BandGapVolts / (n * vt)) * (1 - (kelvin / T0)));
    }

    private static double Forward(double celsius, double n, double rs, double amps)
    {
        var vt = 1.380649e-23 * (celsius + 273.15) / 1.602176634e-19;
        return (n * vt * Math.Log((amps / SaturationAmps(celsius, n)) + 1)) + (amps * rs);
    }

    private static ShockleyFitResult FitAt(double celsius, double n, double rs)
    {
        var points = ShockleySweeps.Sweep(SaturationAmps(celsius, n), n, rs, celsius + 273.15, ShockleySweeps.LogCurrents(1e-6, 1e-3, 8));
        return ShockleyFit.Fit(points, celsius + 273.15).Value;
    }
}
