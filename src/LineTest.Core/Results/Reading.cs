namespace LineTest.Core.Results;

/// <summary>
/// One measured or computed value with its unit, limits, uncertainty and verdict.
/// </summary>
/// <param name="Name">Stable name quality staff group by, e.g. <c>verify.error</c>.</param>
/// <param name="Value">The value, or null when it could not be obtained (verdict is then error).</param>
/// <param name="Unit">Unit of measure symbol, e.g. <c>V</c>, <c>mA</c>, <c>degC</c>.</param>
/// <param name="Low">Lower tolerance limit, or null when one-sided.</param>
/// <param name="High">Upper tolerance limit, or null when one-sided.</param>
/// <param name="Verdict">Pass, fail or error.</param>
public sealed record Reading(string Name, double? Value, string Unit, double? Low, double? High, Verdict Verdict)
{
    /// <summary>The step that produced the reading.</summary>
    public string? Step { get; init; }

    /// <summary>The setpoint name the reading was taken at, if any.</summary>
    public string? Setpoint { get; init; }

    /// <summary>Combined standard uncertainty u_c (JCGM 100:2008), same unit as the value.</summary>
    public double? StandardUncertainty { get; init; }

    /// <summary>Expanded uncertainty U = k·u_c.</summary>
    public double? ExpandedUncertainty { get; init; }

    /// <summary>Coverage factor k used for <see cref="ExpandedUncertainty"/>.</summary>
    public double? CoverageFactor { get; init; }

    /// <summary>Decision rule applied (ILAC G8:09/2019), e.g. <c>simple</c> or <c>guarded</c>.</summary>
    public string? DecisionRule { get; init; }

    /// <summary>Lower acceptance limit actually used (after any guard band).</summary>
    public double? AcceptanceLow { get; init; }

    /// <summary>Upper acceptance limit actually used (after any guard band).</summary>
    public double? AcceptanceHigh { get; init; }

    /// <summary>Number of samples averaged into the value.</summary>
    public int? Samples { get; init; }

    /// <summary>A plain-language note, e.g. why the value is missing.</summary>
    public string? Note { get; init; }

    /// <summary>When the reading was taken (UTC).</summary>
    public DateTimeOffset? At { get; init; }
}
