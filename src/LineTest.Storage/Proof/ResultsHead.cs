namespace LineTest.Storage.Proof;

/// <summary>
/// The content of <c>results.head</c>: the database state after the last write (<see cref="Current"/>) and the state just
/// before it (<see cref="Previous"/>). The file is replaced before that write commits, so after a stop at any moment the
/// database matches one of the two: <see cref="Current"/> when the write committed, <see cref="Previous"/> when it did not.
/// </summary>
/// <param name="Current">The state after the last write.</param>
/// <param name="Previous">The state before it, or null for the first write.</param>
public sealed record ResultsHead(HeadState Current, HeadState? Previous);
