using System.Globalization;
using LineTest.Core.Results;

namespace LineTest.Core.Decisions;

/// <summary>
/// Pass/fail decisions per ILAC G8:09/2019 §4.2. Simple acceptance: AL = TL. Guarded acceptance:
/// AL = TU − w and AL = TL + w with w = r·U, so that a value near a limit passes only when the
/// measurement uncertainty cannot carry it across. A value equal to an acceptance limit passes.
/// </summary>
public static class Acceptance
{
    /// <summary>Judges a value against its limits.</summary>
    /// <param name="value">The measured value; null or non-finite gives <see cref="Verdict.Error"/>.</param>
    /// <param name="limits">Tolerance limits and rule.</param>
    /// <param name="expandedUncertainty">
    /// The value's expanded uncertainty U; required by the guarded rule (an error verdict without it),
    /// ignored by the simple rule.
    /// </param>
    public static Decision Decide(double? value, LimitSpec limits, double? expandedUncertainty = null)
    {
        ArgumentNullException.ThrowIfNull(limits);
        if (expandedUncertainty is { } uCheck && !(double.IsFinite(uCheck) && uCheck >= 0.0))
        {
            throw new ArgumentOutOfRangeException(nameof(expandedUncertainty), expandedUncertainty, "Expanded uncertainty must be finite, zero or more.");
        }

        var ruleName = RuleName(limits.Rule);
        var problems = limits.Check();
        if (problems.Count > 0)
        {
            return new Decision(Verdict.Error, null, null, 0.0, ruleName) { Note = "limits unusable: " + string.Join("; ", problems) };
        }

        double guardBand;
        if (limits.Rule == DecisionRule.Guarded)
        {
            if (expandedUncertainty is not { } u)
            {
                return new Decision(Verdict.Error, null, null, 0.0, ruleName)
                {
                    Note = "the guarded rule needs the measurement's expanded uncertainty, and none was given",
                };
            }

            guardBand = limits.GuardBandFactor * u;
        }
        else
        {
            guardBand = 0.0;
        }

        var acceptanceLow = limits.Low + guardBand;
        var acceptanceHigh = limits.High - guardBand;

        if (value is not { } v || !double.IsFinite(v))
        {
            return new Decision(Verdict.Error, acceptanceLow, acceptanceHigh, guardBand, ruleName)
            {
                Note = value is null ? "no value was obtained" : $"value is {Text(value.Value)}",
            };
        }

        if (acceptanceLow is { } al && acceptanceHigh is { } ah && al > ah)
        {
            return new Decision(Verdict.Fail, acceptanceLow, acceptanceHigh, guardBand, ruleName)
            {
                Note = $"guard band {Text(guardBand)} {limits.Unit} leaves no acceptance zone between {Text(limits.Low!.Value)} and {Text(limits.High!.Value)} {limits.Unit}: the measurement uncertainty is too large for these limits",
            };
        }

        if (acceptanceLow is { } low && v < low)
        {
            return new Decision(Verdict.Fail, acceptanceLow, acceptanceHigh, guardBand, ruleName)
            {
                Note = $"{Text(v)} {limits.Unit} is below the {LimitWord(guardBand)} {Text(low)} {limits.Unit}",
            };
        }

        if (acceptanceHigh is { } high && v > high)
        {
            return new Decision(Verdict.Fail, acceptanceLow, acceptanceHigh, guardBand, ruleName)
            {
                Note = $"{Text(v)} {limits.Unit} is above the {LimitWord(guardBand)} {Text(high)} {limits.Unit}",
            };
        }

        return new Decision(Verdict.Pass, acceptanceLow, acceptanceHigh, guardBand, ruleName);
    }

    /// <summary>The stored word of a rule: <c>simple</c> or <c>guarded</c>.</summary>
    public static string RuleName(DecisionRule rule) => rule switch
    {
        DecisionRule.Simple => "simple",
        DecisionRule.Guarded => "guarded",
        _ => throw new ArgumentOutOfRangeException(nameof(rule), rule, "Unknown decision rule."),
    };

    private static string LimitWord(double guardBand) => guardBand > 0.0 ? "acceptance limit" : "limit";

    private static string Text(double value) => value.ToString("G6", CultureInfo.InvariantCulture);
}
