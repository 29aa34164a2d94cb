using LineTest.Core.Fixtures;
using LineTest.Core.Stability;

namespace LineTest.Core.Decisions;

/// <summary>
/// The uncertainty budgets of the station's readings, from the fixture's instrument specifications and the samples
/// taken (JCGM 100:2008 §4.2 Type A, §4.3 Type B, §5.1 combination). Pure functions: the runtime samples, this decides
/// what the samples and the specifications are worth.
/// </summary>
public static class StationBudgets
{
    /// <summary>Type A of the mean when there are two samples or more; a single sample carries none.</summary>
    public static UncertaintyComponent[] TypeA(string name, double[] samples, double sensitivity = 1.0)
    {
        ArgumentNullException.ThrowIfNull(samples);
        return samples.Length < 2 ? [] : [UncertaintyComponent.FromSamples(name, samples, sensitivity)];
    }

    /// <summary>The name of the extrapolation component in a predictive reading's budget.</summary>
    public const string ExtrapolationComponent = "extrapolation to the final value";

    /// <summary>
    /// The extrapolation's own component of a reading taken in predictive settle mode: the standard uncertainty of the
    /// fitted final value u(y∞) (<see cref="ExponentialApproachFit"/>, Gauss–Newton covariance scaled by the residual
    /// variance), Type A with ν = n − p (JCGM 100:2008 §4.2, §H.3: p parameters fitted to n readings; p = 3 for the
    /// reference's first-order fit, 4 for a unit's follower fit, <see cref="ExponentialApproachResult.FittedParameters"/>), through
    /// <paramref name="sensitivity"/> into the reading's unit.
    /// </summary>
    public static UncertaintyComponent Extrapolation(ExponentialApproachResult fit, double sensitivity = 1.0)
    {
        ArgumentNullException.ThrowIfNull(fit);
        if (!fit.Converged)
        {
            throw new ArgumentException("An extrapolation component needs a converged fit.", nameof(fit));
        }

        return UncertaintyComponent.FromStandard(
            ExtrapolationComponent, fit.FinalValueStandardUncertainty, UncertaintyType.A, sensitivity, Math.Max(1, fit.Readings - fit.FittedParameters));
    }

    /// <summary>
    /// <paramref name="budget"/> for a reading taken in predictive mode, its samples already moved to the final value
    /// along the fitted approach: the same components plus the <paramref name="extrapolation"/> components, each its own
    /// line of the budget so that the guard band widens by them (JCGM 100:2008 §5.1.2).
    /// </summary>
    public static UncertaintyBudget Predicted(UncertaintyBudget budget, params UncertaintyComponent[] extrapolation)
    {
        ArgumentNullException.ThrowIfNull(budget);
        ArgumentNullException.ThrowIfNull(extrapolation);
        return new UncertaintyBudget([.. budget.Components, .. extrapolation]);
    }

    /// <summary>Half-width of the meter's specification for a reading, volts (± % of reading + offset).</summary>
    public static double MeterHalfWidthVolts(MeterDefinition meter, double volts)
    {
        ArgumentNullException.ThrowIfNull(meter);
        return meter.AccuracyPercentOfReading / 100.0 * Math.Abs(volts) + meter.AccuracyOffsetVolts;
    }

    /// <summary>
    /// Reference temperature budget: certificate U/k, readout resolution through the conversion's slope
    /// <paramref name="celsiusPerRaw"/>, and repeatability (JCGM 100:2008 §4.2, §4.3).
    /// </summary>
    public static UncertaintyBudget Reference(ReferenceDefinition reference, double[] references, double celsiusPerRaw)
    {
        ArgumentNullException.ThrowIfNull(reference);
        return new UncertaintyBudget(
        [
            UncertaintyComponent.FromExpanded("reference certificate", reference.CertificateExpandedUncertaintyC, reference.CertificateCoverageFactor),
            UncertaintyComponent.FromResolution("reference readout resolution", reference.ReadoutResolution, celsiusPerRaw),
            .. TypeA("reference repeatability", references),
        ]);
    }

    /// <summary>Supply current read as volts across a shunt: repeatability, the meter's specification and resolution over the shunt, amperes.</summary>
    public static UncertaintyBudget SupplyCurrent(MeterDefinition meter, double[] amps, double shuntOhms)
    {
        ArgumentNullException.ThrowIfNull(meter);
        ArgumentNullException.ThrowIfNull(amps);
        var meanVolts = amps.Average() * shuntOhms;
        return new UncertaintyBudget(
        [
            .. TypeA("repeatability", amps),
            UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(meter, meanVolts), 1 / shuntOhms),
            UncertaintyComponent.FromResolution("meter resolution", meter.ResolutionVolts, 1 / shuntOhms),
        ]);
    }

    /// <summary>
    /// A unit's output: raw counts carry their repeatability and the one-count resolution of the unit's ADC; volts the
    /// meter's specification and resolution as well (JCGM 100:2008 §4.2, §4.3).
    /// </summary>
    public static UncertaintyBudget UnitOutput(MeterDefinition meter, double[] samples, bool overLink)
    {
        ArgumentNullException.ThrowIfNull(meter);
        ArgumentNullException.ThrowIfNull(samples);
        var mean = samples.Average();
        return new UncertaintyBudget(overLink
            ? [.. TypeA("repeatability", samples), UncertaintyComponent.FromResolution("unit resolution", 1)]
            :
            [
                .. TypeA("repeatability", samples),
                UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(meter, mean)),
                UncertaintyComponent.FromResolution("meter resolution", meter.ResolutionVolts),
            ]);
    }

    /// <summary>
    /// Indicated error (indicated − reference, °C): the unit's repeatability (Type A of the error samples), the meter's
    /// specification and resolution through the sensitivity 1/S (not for a unit that reports °C over its link), and the
    /// reference (its budget without its repeatability, which is already in the error samples) (JCGM 100:2008 §4.2,
    /// §4.3, §5.1).
    /// </summary>
    public static UncertaintyBudget IndicatedError(
        MeterDefinition meter, double[] errors, double meanVolts, double slopeVoltsPerC, bool overLink, UncertaintyBudget reference)
    {
        ArgumentNullException.ThrowIfNull(meter);
        ArgumentNullException.ThrowIfNull(reference);
        UncertaintyComponent[] meterParts = overLink
            ? []
            :
            [
                UncertaintyComponent.FromRectangular("meter accuracy", MeterHalfWidthVolts(meter, meanVolts), 1 / Math.Abs(slopeVoltsPerC)),
                UncertaintyComponent.FromResolution("meter resolution", meter.ResolutionVolts, 1 / Math.Abs(slopeVoltsPerC)),
            ];
        return new UncertaintyBudget(
        [
            .. TypeA("repeatability", errors),
            .. meterParts,
            .. reference.Components.Where(c => c.Name != "reference repeatability"),
        ]);
    }
}
