namespace LineTest.Core.Sequences;

/// <summary>
/// Tolerance limits of a reading, with its unit of measure and the decision rule (ILAC G8:09/2019).
/// Either limit may be omitted for a one-sided check.
/// </summary>
public sealed record LimitDefinition
{
    /// <summary>Lower tolerance limit, or null.</summary>
    public double? Low { get; init; }

    /// <summary>Upper tolerance limit, or null.</summary>
    public double? High { get; init; }

    /// <summary>Unit of measure symbol; see <see cref="UnitsOfMeasure"/>.</summary>
    public required string Unit { get; init; }

    /// <summary><c>simple</c> (default) or <c>guarded</c> acceptance.</summary>
    public string Rule { get; init; } = "simple";

    /// <summary>Guard band w = r·U for the guarded rule; r defaults to 1.</summary>
    public double GuardBandFactor { get; init; } = 1;
}
