using System.Text.RegularExpressions;

namespace LineTest.Core.Scanning;

/// <summary>
/// Decides whether a scanned serial may be loaded: it must match the sequence's serial pattern, must not already
/// be in the fixture, and must not have passed today; a serial that ran before and did not pass is a retest.
/// </summary>
public sealed class ScanRules
{
    private readonly Regex _pattern;

    /// <summary>Creates the rules for a sequence's serial pattern.</summary>
    /// <param name="serialPattern">The sequence's serial pattern (a .NET regular expression).</param>
    /// <param name="matchTimeout">Longest time one match may take (default 1 s), so a pathological pattern cannot stall the station.</param>
    /// <param name="example">A serial that matches, shown in refusals instead of the pattern (the sequence's <c>serialExample</c>).</param>
    public ScanRules(string serialPattern, TimeSpan? matchTimeout = null, string? example = null)
    {
        Example = example;
        ArgumentException.ThrowIfNullOrWhiteSpace(serialPattern);
        _pattern = new Regex(serialPattern, RegexOptions.None, matchTimeout ?? TimeSpan.FromSeconds(1));
        Pattern = serialPattern;
    }

    /// <summary>An example serial for refusals, if the sequence gives one.</summary>
    public string? Example { get; }

    /// <summary>The serial pattern.</summary>
    public string Pattern { get; }

    /// <summary>Checks a scan.</summary>
    /// <param name="scanned">What the scanner typed (surrounding blanks and control characters are ignored).</param>
    /// <param name="inFixture">Serials already loaded in this fixture.</param>
    /// <param name="history">What the results say about this serial.</param>
    public ScanDecision Check(string scanned, IReadOnlyCollection<string> inFixture, SerialHistory history)
    {
        ArgumentNullException.ThrowIfNull(scanned);
        ArgumentNullException.ThrowIfNull(inFixture);
        ArgumentNullException.ThrowIfNull(history);
        var serial = new string(scanned.Where(c => !char.IsControl(c)).ToArray()).Trim();
        if (serial.Length == 0)
        {
            return ScanDecision.Refuse(serial, "nothing was scanned");
        }

        bool matches;
        try
        {
            matches = _pattern.IsMatch(serial);
        }
        catch (RegexMatchTimeoutException)
        {
            return ScanDecision.Refuse(serial, $"checking '{serial}' against the serial pattern {Pattern} took too long (the pattern backtracks too much: ask the test engineer to simplify it)");
        }

        if (!matches)
        {
            return ScanDecision.Refuse(serial, Example is { } like
                ? $"'{serial}' is not a serial of this product (expected like {like})"
                : $"'{serial}' is not a serial of this product (expected {Pattern})");
        }

        if (inFixture.Contains(serial, StringComparer.Ordinal))
        {
            return ScanDecision.Refuse(serial, $"{serial} is already loaded in this fixture");
        }

        if (history.PassedToday)
        {
            return ScanDecision.Refuse(serial, $"{serial} already passed today; it needs no retest");
        }

        return ScanDecision.Accept(serial, isRetest: history.PreviousRuns > 0);
    }
}
