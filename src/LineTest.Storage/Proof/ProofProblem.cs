namespace LineTest.Storage.Proof;

/// <summary>One problem found by comparing the database with its head, its seq counter or an expected anchor.</summary>
/// <param name="Kind">What was found.</param>
/// <param name="Message">A plain sentence for the quality engineer.</param>
public sealed record ProofProblem(ProofProblemKind Kind, string Message);
