using LineTest.Core.Results;

namespace LineTest.Core.Statistics;

/// <summary>The part of a stored run that yield statistics need.</summary>
/// <param name="Serial">The unit's serial.</param>
/// <param name="EndedUtc">When the run ended; orders a unit's runs.</param>
/// <param name="Verdict">The run's verdict.</param>
/// <param name="FailureName">Name of the first failing reading, for a failed run.</param>
/// <param name="ErrorReason">Why the run could not be completed, for a run in error.</param>
public sealed record RunOutcome(string Serial, DateTimeOffset EndedUtc, Verdict Verdict, string? FailureName, string? ErrorReason);
