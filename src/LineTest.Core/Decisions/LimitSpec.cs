using System.Globalization;

namespace LineTest.Core.Decisions;

/// <summary>
/// Tolerance limits of a reading as a sequence declares them, with the decision rule to apply.
/// JSON: <c>{ "low": -0.2, "high": 0.2, "unit": "degC", "rule": "guarded", "guardBandFactor": 1 }</c>.
/// Either limit may be omitted for a one-sided test.
/// </summary>
public sealed record LimitSpec
{
    /// <summary>Lower tolerance limit, or null when there is none.</summary>
    public double? Low { get; init; }

    /// <summary>Upper tolerance limit, or null when there is none.</summary>
    public double? High { get; init; }

    /// <summary>Unit symbol of the limits and the value, e.g. <c>degC</c>, <c>V</c>, <c>mA</c>.</summary>
    public required string Unit { get; init; }

    /// <summary>Decision rule; <c>simple</c> by default.</summary>
    public DecisionRule Rule { get; init; } = DecisionRule.Simple;

    /// <summary>
    /// r in the guard band w = r·U (ILAC G8:09/2019 §4.2.2); 1 by default, which with U at k = 2 keeps the
    /// specific false-accept risk at or below 2.5 %. Ignored by the simple rule.
    /// </summary>
    public double GuardBandFactor { get; init; } = 1.0;

    /// <summary>Problems that make the limits unusable, each naming its JSON field; empty when sound.</summary>
    public IReadOnlyList<string> Check()
    {
        var problems = new List<string>();
        if (Low is { } low && !double.IsFinite(low))
        {
            problems.Add("low: must be a finite number");
        }

        if (High is { } high && !double.IsFinite(high))
        {
            problems.Add("high: must be a finite number");
        }

        if (Low is { } l && High is { } h && l > h)
        {
            problems.Add(string.Create(CultureInfo.InvariantCulture, $"low ({l}) is above high ({h})"));
        }

        if (string.IsNullOrWhiteSpace(Unit))
        {
            problems.Add("unit: must name the unit of the limits");
        }

        if (!(double.IsFinite(GuardBandFactor) && GuardBandFactor >= 0.0))
        {
            problems.Add("guardBandFactor: must be a finite number, zero or more");
        }

        if (!Enum.IsDefined(Rule))
        {
            problems.Add("rule: must be simple or guarded");
        }

        return problems;
    }
}
