using LineTest.Storage.Proof;

namespace LineTest.Storage.Backup;

/// <summary>The outcome of <see cref="ResultsBackup.CreateAsync(string, string, CancellationToken)"/>.</summary>
/// <param name="File">The backup file, or null when no backup was made.</param>
/// <param name="HeadFile">The head written beside it (<c>FILE.head</c>), or null.</param>
/// <param name="Head">The state the backup holds.</param>
/// <param name="Problem">Why no backup was made, or null.</param>
/// <param name="Warning">A fact to tell (the source did not match its own head), or null.</param>
public sealed record BackupResult(string? File, string? HeadFile, HeadState? Head, string? Problem, string? Warning);
