using System.Globalization;
using LineTest.Core.Results;

namespace LineTest.Runtime.Batches;

/// <summary>Plain-language descriptions of readings for reasons and logs.</summary>
public static class ReadingText
{
    /// <summary>E.g. "verify.error 0.412 degC above high limit 0.25 degC".</summary>
    public static string Describe(Reading reading)
    {
        ArgumentNullException.ThrowIfNull(reading);
        if (reading.Value is not { } value)
        {
            return $"{reading.Name}: no value{(reading.Note is null ? string.Empty : $" ({reading.Note})")}";
        }

        var v = Format(value);
        var low = reading.AcceptanceLow ?? reading.Low;
        var high = reading.AcceptanceHigh ?? reading.High;
        var guarded = reading.DecisionRule == "guarded" ? " acceptance" : string.Empty;
        if (low is { } lo && value < lo)
        {
            return $"{reading.Name} {v} {reading.Unit} below{guarded} low limit {Format(lo)} {reading.Unit}";
        }

        if (high is { } hi && value > hi)
        {
            return $"{reading.Name} {v} {reading.Unit} above{guarded} high limit {Format(hi)} {reading.Unit}";
        }

        return $"{reading.Name} {v} {reading.Unit}";
    }

    /// <summary>Formats a number with up to 6 significant digits, invariant culture.</summary>
    public static string Format(double value) => value.ToString("G6", CultureInfo.InvariantCulture);
}
