using System.Globalization;

namespace LineTest.Storage.Proof;

/// <summary>
/// What the results database held after one write: the last run (seq and record hash), how many runs, a digest of the
/// release list (releases and revocations) and the rows of the journal of runs in progress.
/// </summary>
/// <param name="Seq">The last stored run's seq (0 when none).</param>
/// <param name="Sha256">The last stored run's record hash (<see cref="Chain.RecordHash.Genesis"/> when none).</param>
/// <param name="Runs">How many runs are stored.</param>
/// <param name="Releases">How many release and revocation rows there are.</param>
/// <param name="ReleasesDigest">SHA-256 over every release and revocation row, in order (see <see cref="ProofReader"/>).</param>
/// <param name="Journal">The journal rows, ordered by id.</param>
public sealed record HeadState(long Seq, string Sha256, long Runs, long Releases, string ReleasesDigest, IReadOnlyList<JournalProof> Journal)
{
    /// <summary>The anchor to write down and check later with <c>verify --expect-head</c>: <c>SEQ:HASH</c>.</summary>
    public string Anchor => string.Create(CultureInfo.InvariantCulture, $"{Seq}:{Sha256}");

    /// <summary>
    /// True when <paramref name="other"/> shows the same database content: same last run, same release list, same journal.
    /// The run count is not compared (the database's count is only taken when checking, not at every write).
    /// </summary>
    public bool SameContent(HeadState other)
    {
        ArgumentNullException.ThrowIfNull(other);
        return Seq == other.Seq
            && Sha256 == other.Sha256
            && Releases == other.Releases
            && ReleasesDigest == other.ReleasesDigest
            && Journal.SequenceEqual(other.Journal);
    }

    /// <summary>Parses an anchor <c>SEQ:HASH</c>; null when it is not one.</summary>
    public static (long Seq, string Sha256)? ParseAnchor(string? text)
    {
        var parts = text?.Trim().Split(':');
        return parts is { Length: 2 }
            && long.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out var seq)
            && parts[1].Length == 64
            && parts[1].All(char.IsAsciiHexDigit)
            ? (seq, parts[1].ToLowerInvariant())
            : null;
    }
}
