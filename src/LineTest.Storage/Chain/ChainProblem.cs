namespace LineTest.Storage.Chain;

/// <summary>The first place where the stored runs disagree with their hash chain.</summary>
/// <param name="Kind">What was found.</param>
/// <param name="Seq">Insertion order (<c>seq</c>) of the run where it was found.</param>
/// <param name="RunId">That run's id, or null when the id itself is unreadable.</param>
/// <param name="Message">A plain sentence for the quality engineer.</param>
public sealed record ChainProblem(ChainProblemKind Kind, long Seq, Guid? RunId, string Message);
