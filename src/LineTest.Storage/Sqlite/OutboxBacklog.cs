namespace LineTest.Storage.Sqlite;

/// <summary>What a station has stored but a factory database has not yet committed.</summary>
/// <param name="Count">Runs waiting.</param>
/// <param name="OldestEndedUtc">End of the oldest waiting run, or null when none waits.</param>
/// <param name="ForwardedThroughSeq">Highest seq the factory has committed (0 when none).</param>
public readonly record struct OutboxBacklog(long Count, DateTimeOffset? OldestEndedUtc, long ForwardedThroughSeq);
