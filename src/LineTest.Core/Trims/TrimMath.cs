using System.Globalization;

namespace LineTest.Core.Trims;

/// <summary>Small helpers shared by the trim methods.</summary>
internal static class TrimMath
{
    /// <summary>Largest magnitude a code may have and still convert exactly to an integer (2⁵³).</summary>
    public const double MaxExactInteger = 9_007_199_254_740_992.0;

    /// <summary>Rounds half away from zero, the rule stated in the trim documentation.</summary>
    public static double RoundCode(double ideal) => Math.Round(ideal, MidpointRounding.AwayFromZero);

    /// <summary>Invariant text with up to 6 significant digits.</summary>
    public static string Text(double value) => value.ToString("G6", CultureInfo.InvariantCulture);

    /// <summary>Invariant text of an integer.</summary>
    public static string Text(long value) => value.ToString(CultureInfo.InvariantCulture);

    /// <summary>Keys unique by appending #2, #3… to repeated names.</summary>
    public static string UniqueKey(string name, ISet<string> used)
    {
        if (used.Add(name))
        {
            return name;
        }

        for (var i = 2; ; i++)
        {
            var candidate = string.Create(CultureInfo.InvariantCulture, $"{name}#{i}");
            if (used.Add(candidate))
            {
                return candidate;
            }
        }
    }

    /// <summary>Predicted errors as the name-keyed dictionary of a trim record.</summary>
    public static IReadOnlyDictionary<string, double> ToDictionary(IReadOnlyList<PredictedError> errors)
    {
        var used = new HashSet<string>(StringComparer.Ordinal);
        var result = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var error in errors)
        {
            result[UniqueKey(error.Name, used)] = error.ErrorC;
        }

        return result;
    }
}
