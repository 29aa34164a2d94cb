using LineTest.Core.Results;
using LineTest.Core.Sequences;

namespace LineTest.Runtime.Judging;

/// <summary>Turns a value and its sequence limits into a judged <see cref="Reading"/>.</summary>
internal static class ReadingJudge
{
    /// <summary>Judges a value given in the limit's unit.</summary>
    public static Reading Judge(string name, double value, LimitDefinition limits, double? standardUncertainty, double coverageFactor = 2)
    {
        double? expanded = standardUncertainty is { } u ? coverageFactor * u : null;
        var guard = limits.Rule == "guarded" && expanded is { } U ? limits.GuardBandFactor * U : 0.0;
        double? acceptLow = limits.Low is { } lo ? lo + guard : null;
        double? acceptHigh = limits.High is { } hi ? hi - guard : null;
        var pass = double.IsFinite(value)
            && (acceptLow is not { } al || value >= al)
            && (acceptHigh is not { } ah || value <= ah);
        return new Reading(name, value, limits.Unit, limits.Low, limits.High, pass ? Verdict.Pass : Verdict.Fail)
        {
            StandardUncertainty = standardUncertainty,
            ExpandedUncertainty = expanded,
            CoverageFactor = standardUncertainty is null ? null : coverageFactor,
            DecisionRule = limits.Rule,
            AcceptanceLow = acceptLow,
            AcceptanceHigh = acceptHigh,
        };
    }

    /// <summary>A reading with no limits (recorded for traceability and statistics).</summary>
    public static Reading Record(string name, double value, string unit, double? standardUncertainty = null) =>
        new(name, value, unit, null, null, Verdict.Pass) { StandardUncertainty = standardUncertainty };
}
