using CsCheck;
using LineTest.Core.Characterisation;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace LineTest.Core.Tests.Characterisation;

public sealed class ShockleyFitTests
{
    private const double Kelvin = 298.15;

    public static TheoryData<double, double, double> Junctions => new()
    {
        // Typical small-signal silicon junction, one with higher n and R_s, and a nearly ideal one with almost no R_s.
        { 2.2e-15, 1.05, 20.0 },
        { 5e-13, 1.6, 120.0 },
        { 1e-16, 1.0, 0.5 },
    };

    [Theory]
    [MemberData(nameof(Junctions))]
    public void Fit_NoiselessSyntheticSweep_RecoversParameters(double saturationAmps, double ideality, double seriesOhms)
    {
        var points = ShockleySweeps.Sweep(saturationAmps, ideality, seriesOhms, Kelvin, ShockleySweeps.LogCurrents(1e-6, 1e-3, 10));

        var fit = ShockleyFit.Fit(points, Kelvin).Value;

        // Noiseless data: the optimum is the truth, to well inside the stated tolerances (I_s to 1e-6 relative,
        // n to 1e-8, R_s to 1 mΩ).
        Assert.Equal(Math.Log(saturationAmps), fit.LnSaturationCurrent, 6);
        Assert.Equal(ideality, fit.Ideality, 8);
        Assert.Equal(seriesOhms, fit.SeriesResistanceOhms, 3);
        Assert.True(fit.MaxAbsResidualVolts < 1e-9, $"max residual {fit.MaxAbsResidualVolts} V");
        Assert.InRange(fit.Iterations, 1, ShockleyFit.MaxIterations);
    }

    [Fact]
    public void Fit_NoisySweep_RecoversParametersWithinStandardErrors()
    {
        // 20 µV rms on each voltage (a good source-measure unit on its 2 V range) [common practice].
        var currents = ShockleySweeps.LogCurrents(1e-6, 1e-3, 12);
        var points = ShockleySweeps.Sweep(2.2e-15, 1.05, 20.0, Kelvin, currents, ShockleySweeps.Noise(11, 12, 20e-6));

        var fit = ShockleyFit.Fit(points, Kelvin).Value;

        // Within four standard errors, and within the absolute tolerances the station needs.
        Assert.InRange(fit.Ideality, 1.05 - (4 * fit.IdealityStandardError), 1.05 + (4 * fit.IdealityStandardError));
        Assert.InRange(fit.SeriesResistanceOhms, 20 - (4 * fit.SeriesResistanceStandardErrorOhms), 20 + (4 * fit.SeriesResistanceStandardErrorOhms));
        Assert.InRange(fit.LnSaturationCurrent, Math.Log(2.2e-15) - (4 * fit.LnSaturationCurrentStandardError), Math.Log(2.2e-15) + (4 * fit.LnSaturationCurrentStandardError));
        Assert.Equal(1.05, fit.Ideality, 0.005);
        Assert.Equal(20.0, fit.SeriesResistanceOhms, 0.5);
        Assert.Equal(Math.Log10(2.2e-15), fit.Log10SaturationCurrent, 0.1);
        Assert.InRange(fit.ResidualStandardDeviationVolts, 5e-6, 50e-6);
        Assert.True(fit.MaxAbsResidualVolts < 100e-6);
    }

    [Fact]
    public void Fit_ManyNoisySweeps_StandardErrorsMatchTheScatterOfTheEstimates()
    {
        // The reported standard error of n should describe the spread of n over repeated sweeps (within ±35 % with 200
        // repeats: the sampling error of a standard deviation from 200 values is about 5 %, the rest is the
        // linearisation of the model).
        var currents = ShockleySweeps.LogCurrents(1e-6, 1e-3, 10);
        var estimates = new List<double>();
        var reported = new List<double>();
        for (var seed = 0; seed < 200; seed++)
        {
            var fit = ShockleyFit.Fit(ShockleySweeps.Sweep(2.2e-15, 1.05, 20.0, Kelvin, currents, ShockleySweeps.Noise(seed, 10, 50e-6)), Kelvin).Value;
            estimates.Add(fit.Ideality);
            reported.Add(fit.IdealityStandardError);
        }

        var mean = estimates.Average();
        var scatter = Math.Sqrt(estimates.Sum(e => (e - mean) * (e - mean)) / (estimates.Count - 1));
        Assert.InRange(reported.Average() / scatter, 0.65, 1.35);
        Assert.Equal(1.05, mean, 0.001);
    }

    [Theory]
    [MemberData(nameof(Junctions))]
    public void Fit_AgreesWithMathNetLevenbergMarquardt(double saturationAmps, double ideality, double seriesOhms)
    {
        // Independent reference: MathNet.Numerics' Levenberg–Marquardt minimiser with numerical derivatives, started
        // from the true parameters; both must reach the same optimum of the same noisy data.
        var currents = ShockleySweeps.LogCurrents(1e-6, 1e-3, 10);
        var points = ShockleySweeps.Sweep(saturationAmps, ideality, seriesOhms, Kelvin, currents, ShockleySweeps.Noise(3, 10, 50e-6));
        var vt = ThermalVoltage.AtKelvin(Kelvin);
        var model = ObjectiveFunction.NonlinearModel(
            (Vector<double> p, double i) => (p[1] * vt * Math.Log((i / Math.Exp(p[0])) + 1)) + (i * p[2]),
            Vector<double>.Build.DenseOfArray(currents),
            Vector<double>.Build.DenseOfArray(points.Select(p => p.Volts).ToArray()),
            accuracyOrder: 6);
        var reference = new LevenbergMarquardtMinimizer(gradientTolerance: 1e-15, stepTolerance: 1e-15, functionTolerance: 1e-15, maximumIterations: 2000)
            .FindMinimum(model, Vector<double>.Build.DenseOfArray([Math.Log(saturationAmps), ideality, seriesOhms]));

        var fit = ShockleyFit.Fit(points, Kelvin).Value;

        var ourSum = fit.ResidualsVolts.Sum(r => r * r);
        var theirSum = reference.MinimizedValues.Zip(points, (m, p) => (p.Volts - m) * (p.Volts - m)).Sum();
        Assert.True(ourSum <= theirSum * (1 + 1e-6), $"ours {ourSum}, MathNet {theirSum}");
        Assert.Equal(reference.MinimizingPoint[1], fit.Ideality, 4);
        Assert.Equal(reference.MinimizingPoint[2], fit.SeriesResistanceOhms, 0.05);
        Assert.Equal(reference.MinimizingPoint[0], fit.LnSaturationCurrent, 0.01);
    }

    [Fact]
    public void Fit_RandomJunctions_RecoversParameters()
    {
        // Property: any junction with I_s 1e-17…1e-11 A, n 1…2 and R_s 0…200 Ω is recovered from a noiseless sweep of
        // 8 points from 1 µA to 1 mA.
        Gen.Double[-17, -11].Select(Gen.Double[1.0, 2.0], Gen.Double[0, 200])
            .Sample((log10Is, n, rs) =>
            {
                var points = ShockleySweeps.Sweep(Math.Pow(10, log10Is), n, rs, Kelvin, ShockleySweeps.LogCurrents(1e-6, 1e-3, 8));
                var result = ShockleyFit.Fit(points, Kelvin);
                return result.Succeeded
                    && Math.Abs(result.Value.Log10SaturationCurrent - log10Is) < 1e-5
                    && Math.Abs(result.Value.Ideality - n) < 1e-6
                    && Math.Abs(result.Value.SeriesResistanceOhms - rs) < 1e-3;
            }, iter: 300);
    }

    [Fact]
    public void Fit_ThreePoints_FailsNamingTheMinimum()
    {
        var points = ShockleySweeps.Sweep(2.2e-15, 1.05, 20, Kelvin, [1e-6, 1e-5, 1e-4]);

        var result = ShockleyFit.Fit(points, Kelvin);

        Assert.False(result.Succeeded);
        Assert.Contains("at least 4 points, got 3", result.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_CurrentsNotIncreasing_FailsNamingThePoint()
    {
        IvPoint[] points = [new(1e-6, 0.50), new(1e-5, 0.56), new(5e-6, 0.58), new(1e-4, 0.62)];

        var result = ShockleyFit.Fit(points, Kelvin);

        Assert.False(result.Succeeded);
        Assert.StartsWith("point 3: the current", result.Reason, StringComparison.Ordinal);
        Assert.Contains("must increase", result.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_VoltageFallsAsCurrentRises_FailsAsNonMonotonic()
    {
        IvPoint[] points = [new(1e-6, 0.50), new(1e-5, 0.56), new(1e-4, 0.55), new(1e-3, 0.70)];

        var result = ShockleyFit.Fit(points, Kelvin);

        Assert.False(result.Succeeded);
        Assert.StartsWith("point 3: the voltage", result.Reason, StringComparison.Ordinal);
        Assert.Contains("rises with current", result.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.0, 0.5)]
    [InlineData(-1e-6, 0.5)]
    [InlineData(1e-6, 0.0)]
    [InlineData(1e-6, -0.3)]
    [InlineData(double.NaN, 0.5)]
    public void Fit_NonPositiveFirstPoint_FailsNamingIt(double amps, double volts)
    {
        IvPoint[] points = [new(amps, volts), new(1e-5, 0.56), new(1e-4, 0.62), new(1e-3, 0.70)];

        var result = ShockleyFit.Fit(points, Kelvin);

        Assert.False(result.Succeeded);
        Assert.StartsWith("point 1:", result.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_CurveThatIsNotAJunction_FailsOrShowsLargeResiduals()
    {
        // A resistor (V = I·1 kΩ + 0.1 V) is monotonic but has no exponential region: either the fit fails or its
        // parameters are far from a junction's; it must never look like a good diode.
        var points = ShockleySweeps.LogCurrents(1e-6, 1e-3, 8).Select(i => new IvPoint(i, 0.1 + (i * 1000))).ToArray();

        var result = ShockleyFit.Fit(points, Kelvin);

        Assert.True(!result.Succeeded || result.Value.MaxAbsResidualVolts > 1e-3 || result.Value.Ideality > 2 || result.Value.SeriesResistanceOhms > 500,
            result.ToString());
    }

    [Fact]
    public void Fit_AbsoluteZero_Fails()
    {
        var points = ShockleySweeps.Sweep(2.2e-15, 1.05, 20, Kelvin, ShockleySweeps.LogCurrents(1e-6, 1e-3, 6));

        Assert.False(ShockleyFit.Fit(points, 0).Succeeded);
    }

    [Fact]
    public void VoltsAt_FittedCurve_ReproducesTheModel()
    {
        var points = ShockleySweeps.Sweep(2.2e-15, 1.05, 20, Kelvin, ShockleySweeps.LogCurrents(1e-6, 1e-3, 6));
        var fit = ShockleyFit.Fit(points, Kelvin).Value;

        // At 10 µA: 1.05·25.693 mV·ln(10e-6/2.2e-15 + 1) + 10e-6·20 Ω, computed directly.
        var expected = (1.05 * ThermalVoltage.AtKelvin(Kelvin) * Math.Log((10e-6 / 2.2e-15) + 1)) + (10e-6 * 20);
        Assert.Equal(expected, fit.VoltsAt(10e-6), 9);
    }
}
