using System.Text.RegularExpressions;
using LineTest.Core.Definitions;

namespace LineTest.Core.Sequences;

/// <summary>Checks a sequence's <c>dispositions</c> and <c>serialExample</c>.</summary>
public static class DispositionRules
{
    /// <summary>Adds every problem of the dispositions and the example serial to <paramref name="problems"/>.</summary>
    public static void Check(SequenceDefinition sequence, ProblemList problems)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(problems);
        if (sequence.Dispositions is { } d)
        {
            problems.AddIf(d.Pass is not null && string.IsNullOrWhiteSpace(d.Pass), "$.dispositions.pass", "where a passed unit goes must not be empty");
            problems.AddIf(d.Fail is not null && string.IsNullOrWhiteSpace(d.Fail), "$.dispositions.fail", "where a failed unit goes must not be empty");
            problems.AddIf(d.Error is not null && string.IsNullOrWhiteSpace(d.Error), "$.dispositions.error", "where an unfinished unit goes must not be empty");
            foreach (var (key, value) in d.ByReading ?? new Dictionary<string, string>())
            {
                problems.AddIf(string.IsNullOrWhiteSpace(key), "$.dispositions.byReading", "a reading name must not be empty");
                problems.AddIf(string.IsNullOrWhiteSpace(value), $"$.dispositions.byReading['{key}']", "where the unit goes must not be empty");
            }
        }

        if (sequence.SerialExample is not { } example)
        {
            return;
        }

        try
        {
            problems.AddIf(!string.IsNullOrWhiteSpace(sequence.SerialPattern) && !Regex.IsMatch(example, sequence.SerialPattern, RegexOptions.None, TimeSpan.FromSeconds(1)),
                "$.serialExample", $"the example serial '{example}' does not match the serial pattern {sequence.SerialPattern}");
        }
        catch (ArgumentException)
        {
            // An invalid pattern is reported at $.serialPattern.
        }
        catch (RegexMatchTimeoutException)
        {
            problems.Add("$.serialExample", "checking the example serial against the serial pattern took too long (simplify the pattern)");
        }
    }
}
