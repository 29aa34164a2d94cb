using LineTest.Core.Characterisation;

namespace LineTest.Core.Tests.Characterisation;

/// <summary>Synthetic forward sweeps computed from known junction parameters (the test's ground truth).</summary>
internal static class ShockleySweeps
{
    /// <summary><paramref name="count"/> currents spaced evenly in log from <paramref name="fromAmps"/> to <paramref name="toAmps"/>.</summary>
    public static double[] LogCurrents(double fromAmps, double toAmps, int count) =>
        Enumerable.Range(0, count).Select(i => fromAmps * Math.Pow(toAmps / fromAmps, i / (double)(count - 1))).ToArray();

    /// <summary>
    /// The voltages of a junction with the given parameters at <paramref name="kelvin"/>, computed directly from
    /// V = n·V_T·ln(I/I_s + 1) + I·R_s (the Shockley equation with series resistance), plus optional noise.
    /// </summary>
    public static IvPoint[] Sweep(double saturationAmps, double ideality, double seriesOhms, double kelvin, double[] currents, double[]? noiseVolts = null)
    {
        var vt = 1.380649e-23 * kelvin / 1.602176634e-19;
        return currents
            .Select((i, k) => new IvPoint(i, (ideality * vt * Math.Log((i / saturationAmps) + 1)) + (i * seriesOhms) + (noiseVolts?[k] ?? 0)))
            .ToArray();
    }

    /// <summary>Normal noise from a seeded generator (Box–Muller), volts.</summary>
    public static double[] Noise(int seed, int count, double sigmaVolts)
    {
        var rng = new Random(seed);
        return Enumerable.Range(0, count)
            .Select(_ => sigmaVolts * Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble()))
            .ToArray();
    }
}
