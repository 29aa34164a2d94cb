using LineTest.Core.Results;

namespace LineTest.Core.Decisions;

/// <summary>Builds a <see cref="Reading"/> from a value, its limits and its uncertainty, deciding its verdict.</summary>
public static class ReadingFactory
{
    /// <summary>
    /// Decides the value against <paramref name="limits"/> (see <see cref="Acceptance.Decide"/>) and records
    /// the limits, the acceptance limits used, the rule and the uncertainty on the reading.
    /// </summary>
    /// <param name="name">Stable reading name, e.g. <c>verify.error</c>.</param>
    /// <param name="value">The value, or null when it could not be obtained.</param>
    /// <param name="limits">Tolerance limits, unit and rule.</param>
    /// <param name="uncertainty">The value's uncertainty, or null when the sequence gives none.</param>
    /// <param name="samples">Number of samples averaged into the value, if known.</param>
    /// <param name="at">When the value was taken (from the injected clock).</param>
    public static Reading Create(
        string name,
        double? value,
        LimitSpec limits,
        ExpandedUncertainty? uncertainty = null,
        int? samples = null,
        DateTimeOffset? at = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentNullException.ThrowIfNull(limits);
        if (uncertainty is { } unusable && !(double.IsFinite(unusable.Expanded) && unusable.Expanded >= 0))
        {
            // Samples so scattered (or so large) that their uncertainty overflows cannot be judged against limits:
            // the reading is an error, never a pass, and says why.
            return new Reading(name, value is { } f && double.IsFinite(f) ? f : null, limits.Unit, limits.Low, limits.High, Verdict.Error)
            {
                Samples = samples,
                Note = $"the uncertainty of the value could not be evaluated (U = {unusable.Expanded.ToString(System.Globalization.CultureInfo.InvariantCulture)}): the samples are unusable",
                At = at,
            };
        }

        var decision = Acceptance.Decide(value, limits, uncertainty?.Expanded);
        return new Reading(name, value is { } v && double.IsFinite(v) ? v : null, limits.Unit, limits.Low, limits.High, decision.Verdict)
        {
            StandardUncertainty = uncertainty?.StandardUncertainty,
            ExpandedUncertainty = uncertainty?.Expanded,
            CoverageFactor = uncertainty?.CoverageFactor,
            DecisionRule = decision.Rule,
            AcceptanceLow = decision.AcceptanceLow,
            AcceptanceHigh = decision.AcceptanceHigh,
            Samples = samples,
            Note = decision.Note,
            At = at,
        };
    }
}
