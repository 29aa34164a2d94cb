namespace LineTest.Storage.Releases;

/// <summary>
/// Production mode runs only released sequences: the file's SHA-256 must be on the release list. Returns a plain
/// refusal naming the file's hash and the released hash(es) of the same id and revision, or null when released.
/// </summary>
public static class ReleaseCheck
{
    /// <summary>Checks a sequence file against the release list.</summary>
    /// <param name="releases">The release list.</param>
    /// <param name="sequenceId">Id inside the file.</param>
    /// <param name="revision">Revision inside the file.</param>
    /// <param name="sha256">SHA-256 of the file.</param>
    /// <param name="file">The file's path, for the message.</param>
    /// <returns>Null when the hash is released for this id and revision; otherwise why the file is refused.</returns>
    public static string? Refusal(IReadOnlyList<Release> releases, string sequenceId, int revision, string sha256, string file) =>
        Refusal(releases, [], sequenceId, revision, sha256, file);

    /// <summary>Checks a sequence file against the release list and its revocations: a revoked file is refused.</summary>
    /// <param name="releases">The release list.</param>
    /// <param name="revocations">The revocations.</param>
    /// <param name="sequenceId">Id inside the file.</param>
    /// <param name="revision">Revision inside the file.</param>
    /// <param name="sha256">SHA-256 of the file.</param>
    /// <param name="file">The file's path, for the message.</param>
    /// <returns>Null when the hash is released (and not revoked) for this id and revision; otherwise why the file is refused.</returns>
    public static string? Refusal(
        IReadOnlyList<Release> releases, IReadOnlyList<Revocation> revocations, string sequenceId, int revision, string sha256, string file)
    {
        ArgumentNullException.ThrowIfNull(releases);
        ArgumentNullException.ThrowIfNull(revocations);
        ArgumentNullException.ThrowIfNull(sha256);
        if (revocations.FirstOrDefault(r => string.Equals(r.Sha256, sha256, StringComparison.OrdinalIgnoreCase)) is { } revoked)
        {
            return $"sequence file {file} ({sequenceId} r{revision}, file {sha256}) was revoked by {revoked.RevokedBy} at "
                + $"{Sqlite.UtcText.ToText(revoked.RevokedUtc)} ({revoked.Reason}); production does not run it (release a new revision)";
        }

        var same = releases.Where(r => r.SequenceId == sequenceId && r.SequenceRevision == revision).ToList();
        if (same.Any(r => string.Equals(r.Sha256, sha256, StringComparison.OrdinalIgnoreCase)))
        {
            return null;
        }

        if (same.Count == 0)
        {
            var other = releases.Where(r => string.Equals(r.Sha256, sha256, StringComparison.OrdinalIgnoreCase)).ToList();
            var note = other.Count > 0
                ? $" (this content was released as {other[0].SequenceId} r{other[0].SequenceRevision}, but the file now says {sequenceId} r{revision})"
                : string.Empty;
            return $"sequence file {file} ({sequenceId} r{revision}, file {sha256}) has not been released for production{note}; "
                + "a test engineer releases it with 'linetest release FILE --by NAME'";
        }

        var released = string.Join(", ", same.Select(r => r.Sha256).Distinct(StringComparer.OrdinalIgnoreCase));
        return $"sequence file {file} differs from the released {sequenceId} r{revision}: released {released}, file {sha256}; "
            + "production runs only the released content (release the new file, or restore the released one)";
    }
}
