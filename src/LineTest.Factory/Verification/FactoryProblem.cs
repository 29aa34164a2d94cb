namespace LineTest.Factory.Verification;

/// <summary>The first thing found wrong in one station's chain on the factory database.</summary>
/// <param name="Kind"><c>chain-break</c> (a run deleted or inserted before this one), <c>edited</c> (the record no longer
/// matches its hash), <c>column-edited</c>, <c>readings-edited</c>, <c>missing-at-end</c> (runs deleted from the end) or
/// <c>behind-station</c> (the station says the factory committed more than it holds).</param>
/// <param name="StationSeq">Where, in the station's seq numbers (0 when it is about the chain as a whole).</param>
/// <param name="RunId">The run, when known.</param>
/// <param name="Message">Plain words.</param>
public sealed record FactoryProblem(string Kind, long StationSeq, Guid? RunId, string Message);
