using System.Text.RegularExpressions;

namespace LineTest.Core.Definitions;

/// <summary>
/// The grammar of a name in a definition file that goes somewhere with rules of its own (a register name on the
/// unit link, a port name): a regular expression anchored at both ends and a length. Used by <c>check</c> and written
/// into the JSON Schema as <c>pattern</c> and <c>maxLength</c>.
/// </summary>
public sealed class TextBound
{
    private readonly Regex _regex;

    /// <param name="pattern">The whole-value pattern, ECMAScript-compatible (for the schema) and .NET-compatible.</param>
    /// <param name="maxLength">Longest value, characters.</param>
    /// <param name="rule">The grammar in words, e.g. <c>an upper-case letter, then upper-case letters, digits or _</c>.</param>
    /// <param name="example">A value that fits, e.g. <c>GAIN</c>.</param>
    public TextBound(string pattern, int maxLength, string rule, string example)
    {
        Pattern = pattern;
        MaxLength = maxLength;
        Rule = rule;
        Example = example;
        // In .NET, '$' also matches before a final line feed ("GAIN\n" would pass); '\z' is the true end. The schema keeps
        // '$', which means the end in ECMAScript.
        var dotnet = pattern.EndsWith('$') ? string.Concat(pattern.AsSpan(0, pattern.Length - 1), @"\z") : pattern;
        _regex = new Regex(dotnet, RegexOptions.CultureInvariant, TimeSpan.FromSeconds(1));
    }

    /// <summary>The whole-value pattern.</summary>
    public string Pattern { get; }

    /// <summary>Longest value, characters.</summary>
    public int MaxLength { get; }

    /// <summary>The grammar in words.</summary>
    public string Rule { get; }

    /// <summary>A value that fits.</summary>
    public string Example { get; }

    /// <summary>True when <paramref name="value"/> fits the grammar and the length.</summary>
    public bool Admits(string? value) => value is not null && value.Length <= MaxLength && _regex.IsMatch(value);

    /// <summary>Why <paramref name="value"/> is refused, for a person; null when it fits.</summary>
    public string? Refusal(string? value)
    {
        if (Admits(value))
        {
            return null;
        }

        return string.IsNullOrEmpty(value)
            ? $"must not be empty: give {Rule}, e.g. {Example}"
            : value.Length > MaxLength
                ? $"is {value.Length} characters long; at most {MaxLength}"
                : $"'{Printable(value)}' is not {Rule}, e.g. {Example}";
    }

    /// <summary>Adds a problem at <paramref name="path"/> when <paramref name="value"/> does not fit.</summary>
    public bool Check(string? value, string path, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(problems);
        if (Refusal(value) is not { } reason)
        {
            return true;
        }

        problems.Add(path, reason);
        return false;
    }

    /// <summary>The value with control characters shown as escapes, so a line break in a name is visible.</summary>
    private static string Printable(string value) =>
        string.Concat(value.Take(60).Select(c => char.IsControl(c) ? $"\\u{(int)c:x4}" : c.ToString()));
}
