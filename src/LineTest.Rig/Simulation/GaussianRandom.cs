namespace LineTest.Rig.Simulation;

/// <summary>Normal and log-normal draws from a seeded <see cref="Random"/>, so that every simulated part is repeatable.</summary>
internal static class GaussianRandom
{
    /// <summary>A standard normal draw by the Box–Muller transform (one of the pair is used; repeatability matters more than speed).</summary>
    public static double NextStandardNormal(this Random random)
    {
        // 1 − NextDouble() lies in (0, 1], so the logarithm is finite.
        var u1 = 1.0 - random.NextDouble();
        var u2 = random.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }

    /// <summary>A normal draw with the given mean and standard deviation.</summary>
    public static double NextNormal(this Random random, double mean, double standardDeviation)
        => mean + (standardDeviation * random.NextStandardNormal());

    /// <summary>A normal draw truncated by redrawing until it lies in [min, max].</summary>
    public static double NextTruncatedNormal(this Random random, double mean, double standardDeviation, double min, double max)
    {
        for (var attempt = 0; attempt < 64; attempt++)
        {
            var value = random.NextNormal(mean, standardDeviation);
            if (value >= min && value <= max)
            {
                return value;
            }
        }

        return Math.Clamp(mean, min, max);
    }

    /// <summary>A log-normal draw: <paramref name="median"/>·exp(σ·z), always positive.</summary>
    public static double NextLogNormal(this Random random, double median, double sigmaOfLog)
        => median * Math.Exp(sigmaOfLog * random.NextStandardNormal());
}
