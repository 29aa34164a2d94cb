namespace LineTest.Storage.Releases;

/// <summary>The outcome of a release or revocation request.</summary>
/// <param name="Kind">What happened.</param>
/// <param name="Message">A plain sentence for the test engineer.</param>
/// <param name="Release">The release concerned, when there is one.</param>
public sealed record ReleaseOutcome(ReleaseOutcomeKind Kind, string Message, Release? Release);
