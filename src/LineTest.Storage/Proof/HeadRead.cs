namespace LineTest.Storage.Proof;

/// <summary>The outcome of reading <c>results.head</c>.</summary>
/// <param name="Exists">False when there is no head file.</param>
/// <param name="Head">The head, when the file exists and reads.</param>
/// <param name="Problem">Why an existing file could not be read, or null.</param>
public sealed record HeadRead(bool Exists, ResultsHead? Head, string? Problem);
