using LineTest.Core.Results;

namespace LineTest.Core.Statistics;

/// <summary>
/// The integer counts a <see cref="YieldSummary"/> is made of: runs by verdict, units, units whose first and whose last
/// run passed, and failed and error runs by name. <see cref="YieldAnalysis.Summarize(IReadOnlyList{RunOutcome})"/>
/// counts them from run outcomes; a source that can count them itself (an SQL <c>GROUP BY</c>) fills them directly and
/// <see cref="YieldAnalysis.Summarize(YieldCounts)"/> turns them into the same rates and Pareto bars. Counts of disjoint
/// sets of units add up (<see cref="Add(YieldCounts)"/>).
/// </summary>
public sealed class YieldCounts
{
    private readonly Dictionary<string, int> _failures = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> _errors = new(StringComparer.Ordinal);

    /// <summary>Runs that passed.</summary>
    public int PassRuns { get; private set; }

    /// <summary>Runs that failed.</summary>
    public int FailRuns { get; private set; }

    /// <summary>Runs that ended in error.</summary>
    public int ErrorRuns { get; private set; }

    /// <summary>Distinct units (serials).</summary>
    public int Units { get; private set; }

    /// <summary>Units whose first run passed.</summary>
    public int UnitsPassedFirstRun { get; private set; }

    /// <summary>Units whose last run passed.</summary>
    public int UnitsPassedLastRun { get; private set; }

    /// <summary>All runs.</summary>
    public int Runs => PassRuns + FailRuns + ErrorRuns;

    /// <summary>Failed runs by the name of their first failing reading (trimmed; unnamed ones under <see cref="YieldAnalysis.UnnamedFailure"/>).</summary>
    public IReadOnlyDictionary<string, int> Failures => _failures;

    /// <summary>Error runs by reason (trimmed; none given under <see cref="YieldAnalysis.UnspecifiedError"/>).</summary>
    public IReadOnlyDictionary<string, int> Errors => _errors;

    /// <summary>
    /// Counts <paramref name="count"/> runs of one verdict; <paramref name="name"/> is the first failing reading of a
    /// failed run or the reason of an error run (ignored for a pass).
    /// </summary>
    public void AddRuns(Verdict verdict, string? name, int count = 1)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        switch (verdict)
        {
            case Verdict.Pass:
                PassRuns = checked(PassRuns + count);
                break;
            case Verdict.Fail:
                FailRuns = checked(FailRuns + count);
                Increment(_failures, string.IsNullOrWhiteSpace(name) ? YieldAnalysis.UnnamedFailure : name.Trim(), count);
                break;
            case Verdict.Error:
                ErrorRuns = checked(ErrorRuns + count);
                Increment(_errors, string.IsNullOrWhiteSpace(name) ? YieldAnalysis.UnspecifiedError : name.Trim(), count);
                break;
            default:
                throw new ArgumentOutOfRangeException(nameof(verdict), verdict, "Unknown verdict.");
        }
    }

    /// <summary>Counts <paramref name="units"/> units, of which the given numbers passed their first and their last run.</summary>
    public void AddUnits(int units, int passedFirstRun, int passedLastRun)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(units);
        ArgumentOutOfRangeException.ThrowIfNegative(passedFirstRun);
        ArgumentOutOfRangeException.ThrowIfNegative(passedLastRun);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(passedFirstRun, units);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(passedLastRun, units);
        Units = checked(Units + units);
        UnitsPassedFirstRun = checked(UnitsPassedFirstRun + passedFirstRun);
        UnitsPassedLastRun = checked(UnitsPassedLastRun + passedLastRun);
    }

    /// <summary>Adds the counts of another, disjoint set of units.</summary>
    public void Add(YieldCounts other)
    {
        ArgumentNullException.ThrowIfNull(other);
        PassRuns = checked(PassRuns + other.PassRuns);
        FailRuns = checked(FailRuns + other.FailRuns);
        ErrorRuns = checked(ErrorRuns + other.ErrorRuns);
        AddUnits(other.Units, other.UnitsPassedFirstRun, other.UnitsPassedLastRun);
        foreach (var (name, count) in other._failures)
        {
            Increment(_failures, name, count);
        }

        foreach (var (name, count) in other._errors)
        {
            Increment(_errors, name, count);
        }
    }

    private static void Increment(Dictionary<string, int> counts, string key, int by)
    {
        counts[key] = counts.TryGetValue(key, out var c) ? checked(c + by) : by;
    }
}
