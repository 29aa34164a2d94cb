using LineTest.Core.Results;

namespace LineTest.Core.Sequences;

/// <summary>
/// Where units go after their run, named by the sequence and shown to the operator on the end screen: one place
/// per verdict, and optionally a place per first failing reading (a unit failing its verify may go to a retest
/// rack while one failing its supply current goes to the reject bin).
/// </summary>
public sealed record DispositionSettings
{
    /// <summary>Where a passed unit goes, e.g. <c>packing tray</c>.</summary>
    public string? Pass { get; init; }

    /// <summary>Where a failed unit goes, e.g. <c>red reject bin</c>.</summary>
    public string? Fail { get; init; }

    /// <summary>Where a unit whose test could not be completed goes, e.g. <c>retest rack</c>.</summary>
    public string? Error { get; init; }

    /// <summary>
    /// For a failed unit: where it goes by its first failing reading. A key is a reading name (<c>verify.error</c>) or
    /// a step name that its readings start with (<c>iv-low</c> for <c>iv-low.n</c>); the longest matching key wins.
    /// </summary>
    public IReadOnlyDictionary<string, string>? ByReading { get; init; }

    /// <summary>Where a unit with <paramref name="verdict"/> goes; null when the sequence does not say.</summary>
    public string? For(Verdict verdict, string? firstFailingReading)
    {
        if (verdict == Verdict.Fail && firstFailingReading is not null && ByReading is not null)
        {
            var match = ByReading
                .Where(kv => kv.Key == firstFailingReading || firstFailingReading.StartsWith(kv.Key + ".", StringComparison.Ordinal))
                .OrderByDescending(kv => kv.Key.Length)
                .Select(kv => kv.Value)
                .FirstOrDefault();
            if (match is not null)
            {
                return match;
            }
        }

        return verdict switch
        {
            Verdict.Pass => Pass,
            Verdict.Fail => Fail,
            _ => Error,
        };
    }
}
