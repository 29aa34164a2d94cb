using LineTest.Storage.Sqlite;

namespace LineTest.Storage.Releases;

/// <summary>
/// The rules of the release list: one content per sequence id and revision (a changed file needs a new revision), the
/// same file released twice is one release, a revoked file stays revoked.
/// </summary>
public static class ReleaseRules
{
    /// <summary>Decides what releasing <paramref name="release"/> does, given the releases of the same id and revision.</summary>
    /// <param name="release">The release asked for (SHA-256 in lower case).</param>
    /// <param name="sameRevision">The releases already recorded for its id and revision.</param>
    /// <param name="revocations">Every revocation.</param>
    public static ReleaseOutcome Decide(Release release, IReadOnlyList<Release> sameRevision, IReadOnlyList<Revocation> revocations)
    {
        ArgumentNullException.ThrowIfNull(release);
        ArgumentNullException.ThrowIfNull(sameRevision);
        ArgumentNullException.ThrowIfNull(revocations);
        var name = $"revision {release.SequenceRevision} of {release.SequenceId}";
        if (sameRevision.FirstOrDefault(r => r.Sha256 == release.Sha256) is { } same)
        {
            return revocations.FirstOrDefault(v => v.Sha256 == release.Sha256) is { } revoked
                ? new ReleaseOutcome(
                    ReleaseOutcomeKind.Refused,
                    $"{name} ({release.Sha256}) was revoked by {revoked.RevokedBy} at {UtcText.ToText(revoked.RevokedUtc)} ({revoked.Reason}); raise the revision",
                    same)
                : new ReleaseOutcome(
                    ReleaseOutcomeKind.AlreadyDone,
                    $"{name} ({release.Sha256}) is already released, by {same.ReleasedBy} at {UtcText.ToText(same.ReleasedUtc)}; nothing changed",
                    same);
        }

        if (sameRevision.Count > 0)
        {
            var other = sameRevision[0];
            return new ReleaseOutcome(
                ReleaseOutcomeKind.Refused,
                $"{name} is already released as {other.Sha256} (by {other.ReleasedBy} at {UtcText.ToText(other.ReleasedUtc)}), and this file is {release.Sha256}; raise the revision",
                other);
        }

        return new ReleaseOutcome(
            ReleaseOutcomeKind.Recorded,
            $"Released {release.SequenceId} r{release.SequenceRevision}: sha256 {release.Sha256}, by {release.ReleasedBy} at {UtcText.ToText(release.ReleasedUtc)}",
            release);
    }

    /// <summary>
    /// Finds the one release whose SHA-256 is <paramref name="sha256"/> or starts with it (at least 8 hex digits);
    /// otherwise says why not.
    /// </summary>
    public static (Release? Release, string? Refusal) Find(IReadOnlyList<Release> releases, string sha256)
    {
        ArgumentNullException.ThrowIfNull(releases);
        ArgumentNullException.ThrowIfNull(sha256);
        var wanted = sha256.Trim().ToLowerInvariant();
        if (wanted.Length < 8 || !wanted.All(char.IsAsciiHexDigit))
        {
            return (null, $"'{sha256}' is not a SHA-256 (give the full hash or at least its first 8 hex digits, as 'release --list' shows)");
        }

        var matches = releases.Where(r => r.Sha256.StartsWith(wanted, StringComparison.Ordinal)).DistinctBy(r => r.Sha256).ToList();
        return matches.Count switch
        {
            1 => (matches[0], null),
            0 => (null, $"no released file has SHA-256 {wanted}; 'release --list' shows the release list"),
            _ => (null, $"{wanted} starts {matches.Count} released hashes ({string.Join(", ", matches.Select(m => m.Sha256))}); give more digits"),
        };
    }
}
