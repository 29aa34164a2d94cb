namespace LineTest.Factory.Forwarding;

/// <summary>A run refused at the factory's door, as written to the <c>alarms</c> table and the log.</summary>
/// <param name="Kind"><c>changed-record</c>, <c>bad-record-hash</c>, <c>chain-break</c> or <c>unreadable-record</c>.</param>
/// <param name="Station">Station id.</param>
/// <param name="ChainId">The station database's chain.</param>
/// <param name="StationSeq">The run's seq in the station's database.</param>
/// <param name="RunId">Run id.</param>
/// <param name="StoredSha256">The hash the factory already holds, if any.</param>
/// <param name="OfferedSha256">The hash the station offered.</param>
/// <param name="Detail">Plain words.</param>
public sealed record FactoryAlarm(
    string Kind, string Station, Guid ChainId, long StationSeq, Guid RunId, string? StoredSha256, string OfferedSha256, string Detail);
