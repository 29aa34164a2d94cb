namespace LineTest.Core.Stability;

/// <summary>Settings of an <see cref="ExponentialApproachFit"/>; every default is documented on its property.</summary>
public sealed record ExponentialFitOptions
{
    /// <summary>The defaults.</summary>
    public static ExponentialFitOptions Default { get; } = new();

    /// <summary>Shortest time constant searched, as a fraction of the readings' span. Default 0.01.</summary>
    public double MinTauFractionOfSpan { get; init; } = 0.01;

    /// <summary>
    /// Longest time constant searched, as a multiple of the readings' span. Default 10: beyond that the readings are
    /// still nearly a straight line and the final value is not determined by them.
    /// </summary>
    public double MaxTauMultipleOfSpan { get; init; } = 10;

    /// <summary>Residuals smaller than this (value units) count as zero in the runs test. Default 1e-6.</summary>
    public double DisturbanceTolerance { get; init; } = 1e-6;

    /// <summary>
    /// A runs-test z-score below minus this flags a disturbance: too few sign changes means the residuals follow a
    /// shape the model does not have (a step, a second slower approach). Default 3 (one-sided, about 0.13 % false alarms
    /// for white noise).
    /// </summary>
    public double RunsTestCriticalZ { get; init; } = 3;

    /// <summary>The readings' expected noise (standard deviation), when known; null skips the size test. Default null.</summary>
    public double? ExpectedNoiseSd { get; init; }

    /// <summary>A residual RMS above this multiple of <see cref="ExpectedNoiseSd"/> flags a disturbance. Default 4.</summary>
    public double NoiseMultipleForDisturbance { get; init; } = 4;
}
