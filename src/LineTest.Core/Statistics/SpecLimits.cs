namespace LineTest.Core.Statistics;

/// <summary>
/// Specification limits of one measurement, in the measurement's own unit. Either limit may be absent
/// (one-sided specification); when both are present the lower is below the upper.
/// </summary>
public readonly record struct SpecLimits
{
    /// <summary>Creates limits; throws when a limit is not finite or lower ≥ upper.</summary>
    public SpecLimits(double? lower, double? upper)
    {
        if (lower is { } l && !double.IsFinite(l))
        {
            throw new ArgumentOutOfRangeException(nameof(lower), l, "A lower specification limit must be a finite number.");
        }

        if (upper is { } u && !double.IsFinite(u))
        {
            throw new ArgumentOutOfRangeException(nameof(upper), u, "An upper specification limit must be a finite number.");
        }

        if (lower is { } lo && upper is { } hi && !(lo < hi))
        {
            throw new ArgumentException($"The lower specification limit ({lo}) must be below the upper ({hi}).", nameof(lower));
        }

        Lower = lower;
        Upper = upper;
    }

    /// <summary>Lower specification limit (LSL), or null for none.</summary>
    public double? Lower { get; }

    /// <summary>Upper specification limit (USL), or null for none.</summary>
    public double? Upper { get; }

    /// <summary>True when both limits are given.</summary>
    public bool IsTwoSided => Lower.HasValue && Upper.HasValue;

    /// <summary>Both limits.</summary>
    public static SpecLimits Between(double lower, double upper) => new(lower, upper);

    /// <summary>Only a lower limit.</summary>
    public static SpecLimits AtLeast(double lower) => new(lower, null);

    /// <summary>Only an upper limit.</summary>
    public static SpecLimits AtMost(double upper) => new(null, upper);
}
