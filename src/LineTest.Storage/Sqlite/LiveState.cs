namespace LineTest.Storage.Sqlite;

/// <summary>What a live page needs to know cheaply about a results database: has anything changed, is a batch running.</summary>
/// <param name="LastSeq">The highest stored run seq; 0 when no run is stored.</param>
/// <param name="InProgress">Runs in progress (rows of the journal: units under test now).</param>
/// <param name="LastProgressUtc">When the journal was last written; null when nothing is in progress.</param>
public readonly record struct LiveState(long LastSeq, int InProgress, DateTimeOffset? LastProgressUtc);
