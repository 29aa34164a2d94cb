using System.Globalization;

namespace LineTest.Core.Decisions;

/// <summary>
/// One input of an uncertainty budget: a standard uncertainty u(xᵢ) and its sensitivity coefficient cᵢ
/// (JCGM 100:2008 §5.1.3), so that it contributes |cᵢ|·u(xᵢ) to the combined standard uncertainty.
/// </summary>
public sealed record UncertaintyComponent
{
    /// <summary>What the input is, e.g. <c>reference certificate</c>.</summary>
    public required string Name { get; init; }

    /// <summary>Standard uncertainty u(xᵢ), in the input's own unit.</summary>
    public required double StandardUncertainty { get; init; }

    /// <summary>Sensitivity coefficient cᵢ = ∂y/∂xᵢ (1 when the input is in the measurand's unit).</summary>
    public double SensitivityCoefficient { get; init; } = 1.0;

    /// <summary>Type A or Type B evaluation.</summary>
    public required UncertaintyType Type { get; init; }

    /// <summary>Degrees of freedom νᵢ; null for infinite (the usual assumption for Type B).</summary>
    public double? DegreesOfFreedom { get; init; }

    /// <summary>Contribution |cᵢ|·u(xᵢ) in the measurand's unit.</summary>
    public double Contribution => Math.Abs(SensitivityCoefficient) * StandardUncertainty;

    /// <summary>
    /// Type A from repeated observations: the experimental standard deviation of the mean
    /// u = s/√n with s from n − 1 degrees of freedom (JCGM 100:2008 §4.2.2, §4.2.3); ν = n − 1.
    /// </summary>
    public static UncertaintyComponent FromSamples(string name, IReadOnlyList<double> samples, double sensitivity = 1.0)
    {
        ArgumentNullException.ThrowIfNull(samples);
        if (samples.Count < 2)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"'{name}': a Type A uncertainty needs at least 2 samples, got {samples.Count}."),
                nameof(samples));
        }

        var mean = samples.Average();
        var sumSquares = samples.Sum(x => (x - mean) * (x - mean));
        var s = Math.Sqrt(sumSquares / (samples.Count - 1));
        return Create(name, s / Math.Sqrt(samples.Count), sensitivity, UncertaintyType.A, samples.Count - 1);
    }

    /// <summary>
    /// Type B from bounds ±a with no better knowledge: a rectangular distribution, u = a/√3
    /// (JCGM 100:2008 §4.3.7). Typical source: a meter specification "±(% of reading + counts)".
    /// </summary>
    public static UncertaintyComponent FromRectangular(string name, double halfWidth, double sensitivity = 1.0)
    {
        ThrowIfNegativeOrNotFinite(halfWidth, nameof(halfWidth));
        return Create(name, halfWidth / Math.Sqrt(3.0), sensitivity, UncertaintyType.B, null);
    }

    /// <summary>
    /// Type B from the resolution δ of a digital indication: the value lies within ±δ/2 with equal
    /// probability, u = δ/(2√3) (JCGM 100:2008 §F.2.2.1).
    /// </summary>
    public static UncertaintyComponent FromResolution(string name, double resolution, double sensitivity = 1.0)
    {
        ThrowIfNegativeOrNotFinite(resolution, nameof(resolution));
        return Create(name, resolution / (2.0 * Math.Sqrt(3.0)), sensitivity, UncertaintyType.B, null);
    }

    /// <summary>
    /// Type B from a certificate quoting an expanded uncertainty U with coverage factor k: u = U/k
    /// (JCGM 100:2008 §4.3.3).
    /// </summary>
    public static UncertaintyComponent FromExpanded(string name, double expanded, double coverageFactor, double sensitivity = 1.0)
    {
        ThrowIfNegativeOrNotFinite(expanded, nameof(expanded));
        if (!(double.IsFinite(coverageFactor) && coverageFactor > 0.0))
        {
            throw new ArgumentOutOfRangeException(nameof(coverageFactor), coverageFactor, $"'{name}': coverage factor must be positive.");
        }

        return Create(name, expanded / coverageFactor, sensitivity, UncertaintyType.B, null);
    }

    /// <summary>A standard uncertainty already evaluated elsewhere.</summary>
    public static UncertaintyComponent FromStandard(
        string name, double standardUncertainty, UncertaintyType type, double sensitivity = 1.0, double? degreesOfFreedom = null)
    {
        ThrowIfNegativeOrNotFinite(standardUncertainty, nameof(standardUncertainty));
        return Create(name, standardUncertainty, sensitivity, type, degreesOfFreedom);
    }

    private static UncertaintyComponent Create(string name, double u, double sensitivity, UncertaintyType type, double? dof)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        if (!double.IsFinite(sensitivity))
        {
            throw new ArgumentOutOfRangeException(nameof(sensitivity), sensitivity, $"'{name}': sensitivity coefficient must be finite.");
        }

        return new UncertaintyComponent
        {
            Name = name,
            StandardUncertainty = u,
            SensitivityCoefficient = sensitivity,
            Type = type,
            DegreesOfFreedom = dof,
        };
    }

    private static void ThrowIfNegativeOrNotFinite(double value, string paramName)
    {
        if (!(double.IsFinite(value) && value >= 0.0))
        {
            throw new ArgumentOutOfRangeException(paramName, value, "Must be a finite number, zero or more.");
        }
    }
}
