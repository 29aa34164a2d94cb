namespace LineTest.Storage.Sqlite;

/// <summary>A stored run waiting to be forwarded: its place in the chain and its stored text.</summary>
/// <param name="Seq">Its <c>seq</c> in the station's database.</param>
/// <param name="Id">Run id.</param>
/// <param name="Station">Station id.</param>
/// <param name="EndedUtc">End of the run.</param>
/// <param name="PrevSha256">Hash of the run before it in the chain.</param>
/// <param name="RecordSha256">Its record hash.</param>
/// <param name="RunJson">The stored run text the hash covers.</param>
public sealed record OutboxRun(long Seq, Guid Id, string Station, DateTimeOffset EndedUtc, string PrevSha256, string RecordSha256, string RunJson);
