namespace LineTest.Storage.Proof;

/// <summary>One row of the journal of runs in progress as the head proves it: the run id and SHA-256 of its stored text.</summary>
/// <param name="Id">The run id as stored (text).</param>
/// <param name="Sha256">SHA-256 (FIPS 180-4) of the row's <c>record_json</c>, lower-case hex.</param>
public sealed record JournalProof(string Id, string Sha256);
