using System.Globalization;

namespace LineTest.Core.Definitions;

/// <summary>
/// The range of one number in a sequence or fixture file that the runtime can use: finite, at least
/// <see cref="Minimum"/> (or above it when <see cref="ExclusiveMinimum"/>), at most <see cref="Maximum"/>. The same
/// bound is used by <c>check</c>, written into the JSON Schema (<c>minimum</c>/<c>exclusiveMinimum</c>/<c>maximum</c>)
/// and relied on by the simulator, so a value that passes the check cannot make the station throw later.
/// </summary>
/// <param name="Minimum">Smallest value (or the value every value must exceed).</param>
/// <param name="Maximum">Largest value.</param>
/// <param name="Unit">Unit shown in problems and in the schema (°C, s, V…), empty for a plain number.</param>
/// <param name="ExclusiveMinimum">True when <see cref="Minimum"/> itself is refused (a positive quantity).</param>
/// <param name="WholeNumber">True for counts, codes and channel numbers.</param>
public sealed record NumberBound(double Minimum, double Maximum, string Unit, bool ExclusiveMinimum = false, bool WholeNumber = false)
{
    /// <summary>A positive quantity up to <paramref name="maximum"/>.</summary>
    public static NumberBound Positive(double maximum, string unit) => new(0, maximum, unit, ExclusiveMinimum: true);

    /// <summary>Zero or a positive quantity up to <paramref name="maximum"/>.</summary>
    public static NumberBound NonNegative(double maximum, string unit) => new(0, maximum, unit);

    /// <summary>A whole number from <paramref name="minimum"/> to <paramref name="maximum"/>.</summary>
    public static NumberBound Count(long minimum, long maximum, string unit = "") => new(minimum, maximum, unit, WholeNumber: true);

    /// <summary>True when <paramref name="value"/> is finite and inside the bound.</summary>
    public bool Admits(double value) =>
        double.IsFinite(value) && (ExclusiveMinimum ? value > Minimum : value >= Minimum) && value <= Maximum;

    /// <summary>The bound in words, e.g. <c>above 0 and at most 3600 s</c>.</summary>
    public string Describe()
    {
        var unit = Unit.Length == 0 ? string.Empty : $" {Unit}";
        return ExclusiveMinimum
            ? $"above {F(Minimum)} and at most {F(Maximum)}{unit}"
            : $"{F(Minimum)} … {F(Maximum)}{unit}";
    }

    /// <summary>Why <paramref name="value"/> is refused, for a person; null when it is admitted.</summary>
    public string? Refusal(double value)
    {
        if (Admits(value))
        {
            return null;
        }

        var what = WholeNumber ? "a whole number" : "a number";
        return double.IsFinite(value)
            ? $"must be {what} {Describe()}, not {F(value)}"
            : $"must be {what} {Describe()} (this one is not finite)";
    }

    /// <summary>Adds a problem at <paramref name="path"/> when <paramref name="value"/> is refused.</summary>
    public bool Check(double value, string path, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(problems);
        if (Refusal(value) is not { } reason)
        {
            return true;
        }

        problems.Add(path, reason);
        return false;
    }

    /// <summary>As <see cref="Check(double, string, ProblemList)"/> for an optional value (null is admitted).</summary>
    public bool Check(double? value, string path, ProblemList problems) => value is not { } v || Check(v, path, problems);

    /// <summary>A number as problems show it: plain for ordinary sizes, G4 for the very large and very small.</summary>
    public static string F(double value) =>
        Math.Floor(value) == value && Math.Abs(value) < 1e15 ? value.ToString("0", CultureInfo.InvariantCulture)
        : Math.Abs(value) >= 1e7 || (value != 0 && Math.Abs(value) < 1e-4)
            ? value.ToString("G4", CultureInfo.InvariantCulture)
            : value.ToString("0.######", CultureInfo.InvariantCulture);
}
