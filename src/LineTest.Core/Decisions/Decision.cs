using LineTest.Core.Results;

namespace LineTest.Core.Decisions;

/// <summary>The outcome of judging one value against its limits.</summary>
/// <param name="Verdict">Pass, fail, or error when the value or the rule's inputs were missing.</param>
/// <param name="AcceptanceLow">Lower acceptance limit actually used, or null when one-sided.</param>
/// <param name="AcceptanceHigh">Upper acceptance limit actually used, or null when one-sided.</param>
/// <param name="GuardBand">Guard band w subtracted from each tolerance limit (0 for the simple rule).</param>
/// <param name="Rule">Rule name as stored: <c>simple</c> or <c>guarded</c>.</param>
public sealed record Decision(Verdict Verdict, double? AcceptanceLow, double? AcceptanceHigh, double GuardBand, string Rule)
{
    /// <summary>Why the verdict is fail or error, in plain words; null on pass.</summary>
    public string? Note { get; init; }
}
