using LineTest.Core.Results;

namespace LineTest.Storage.Sqlite;

/// <summary>One stored run as a unit's history shows it: the whole run and its place in the hash chain.</summary>
/// <param name="Seq">Insertion order in the database.</param>
/// <param name="RecordSha256">The run's record hash (lower-case hex), chained to the run before it.</param>
/// <param name="Run">The run, read from its stored JSON.</param>
public sealed record StoredRun(long Seq, string RecordSha256, RunRecord Run);
