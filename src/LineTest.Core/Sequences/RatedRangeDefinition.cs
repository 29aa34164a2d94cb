using LineTest.Core.Decisions;

namespace LineTest.Core.Sequences;

/// <summary>
/// The temperature range over which the product is rated, and optional limits on the error the station predicts over
/// it for each trimmed unit (readings <c>&lt;trim&gt;.predicted.maxAbs</c> and <c>&lt;trim&gt;.predicted.rms</c>).
/// JSON: <c>"ratedRange": { "lowC": -30, "highC": 60, "maxAbsErrorLimits": { "high": 0.3, "unit": "degC" } }</c>.
/// </summary>
public sealed record RatedRangeDefinition
{
    /// <summary>Lowest rated temperature, °C.</summary>
    public required double LowC { get; init; }

    /// <summary>Highest rated temperature, °C.</summary>
    public required double HighC { get; init; }

    /// <summary>Limits on the largest |predicted error| over the range (unit degC), or null to record it unjudged.</summary>
    public LimitSpec? MaxAbsErrorLimits { get; init; }

    /// <summary>Limits on the RMS predicted error over the range (unit degC), or null to record it unjudged.</summary>
    public LimitSpec? RmsErrorLimits { get; init; }
}
