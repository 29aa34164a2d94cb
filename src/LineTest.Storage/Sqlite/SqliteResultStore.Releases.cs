using LineTest.Storage.Releases;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The release list (<c>releases</c>, and <c>release_revocations</c> since schema version 3): sequence files released to
/// production, by content hash, and the releases taken back. Kept in the results database so that the list travels with
/// the runs it governs; append-only like them and proven by <c>results.head</c>.
/// </summary>
public sealed partial class SqliteResultStore
{
    /// <summary>
    /// Adds <paramref name="release"/> to the release list (flushed before this returns), unless the same file is already
    /// released (nothing changes) or its id and revision are released, or were revoked, under another SHA-256 (refused:
    /// a changed file needs a new revision).
    /// </summary>
    /// <exception cref="Store.ResultStoreException">The list could not be written; the message says why.</exception>
    public async Task<ReleaseOutcome> AddReleaseAsync(Release release, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(release);
        var sha = release.Sha256.ToLowerInvariant();
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            ReleaseOutcome? outcome = null;
            InWrite(transaction =>
            {
                var same = ReadReleases(transaction).Where(r => r.SequenceId == release.SequenceId && r.SequenceRevision == release.SequenceRevision).ToList();
                var revoked = ReadRevocations(transaction);
                outcome = ReleaseRules.Decide(release with { Sha256 = sha }, same, revoked);
                if (outcome.Kind == ReleaseOutcomeKind.Recorded)
                {
                    using var command = _connection.CreateCommand();
                    command.Transaction = transaction;
                    command.CommandText = """
                        INSERT INTO releases (sequence_id, sequence_revision, sha256, released_by, released_utc, file)
                        VALUES ($id, $revision, $sha, $by, $at, $file);
                        """;
                    command.Parameters.AddWithValue("$id", release.SequenceId);
                    command.Parameters.AddWithValue("$revision", (long)release.SequenceRevision);
                    command.Parameters.AddWithValue("$sha", sha);
                    command.Parameters.AddWithValue("$by", release.ReleasedBy);
                    command.Parameters.AddWithValue("$at", UtcText.ToText(release.ReleasedUtc));
                    command.Parameters.AddWithValue("$file", release.File);
                    command.ExecuteNonQuery();
                }

                return 0;
            });
            return outcome!;
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException)
        {
            throw SqliteFailures.Map(ex, $"The release of {release.SequenceId} r{release.SequenceRevision} was not saved", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    /// <summary>
    /// Revokes the released file whose SHA-256 is <paramref name="sha256"/> (the full hash, or a prefix of at least 8 hex
    /// digits that names one released file). Revoking twice changes nothing; an unknown or ambiguous hash is refused.
    /// </summary>
    /// <exception cref="Store.ResultStoreException">The revocation could not be written; the message says why.</exception>
    public async Task<ReleaseOutcome> RevokeAsync(string sha256, string revokedBy, string reason, DateTimeOffset revokedUtc, CancellationToken ct)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(sha256);
        ArgumentException.ThrowIfNullOrWhiteSpace(revokedBy);
        ArgumentException.ThrowIfNullOrWhiteSpace(reason);
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            ReleaseOutcome? outcome = null;
            InWrite(transaction =>
            {
                var (found, refusal) = ReleaseRules.Find(ReadReleases(transaction), sha256);
                if (found is null)
                {
                    outcome = new ReleaseOutcome(ReleaseOutcomeKind.Refused, refusal!, null);
                    return 0;
                }

                if (ReadRevocations(transaction).FirstOrDefault(r => r.Sha256 == found.Sha256) is { } earlier)
                {
                    outcome = new ReleaseOutcome(
                        ReleaseOutcomeKind.AlreadyDone,
                        $"{found.Sha256} ({found.SequenceId} r{found.SequenceRevision}) was already revoked by {earlier.RevokedBy} at {UtcText.ToText(earlier.RevokedUtc)}; nothing changed",
                        found);
                    return 0;
                }

                using var command = _connection.CreateCommand();
                command.Transaction = transaction;
                command.CommandText = "INSERT INTO release_revocations (sha256, revoked_by, revoked_utc, reason) VALUES ($sha, $by, $at, $reason);";
                command.Parameters.AddWithValue("$sha", found.Sha256);
                command.Parameters.AddWithValue("$by", revokedBy);
                command.Parameters.AddWithValue("$at", UtcText.ToText(revokedUtc));
                command.Parameters.AddWithValue("$reason", reason);
                command.ExecuteNonQuery();
                outcome = new ReleaseOutcome(
                    ReleaseOutcomeKind.Recorded,
                    $"Revoked {found.SequenceId} r{found.SequenceRevision} (sha256 {found.Sha256}) by {revokedBy} at {UtcText.ToText(revokedUtc)}: {reason}; production refuses this file from now on",
                    found);
                return 0;
            });
            return outcome!;
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException)
        {
            throw SqliteFailures.Map(ex, $"The revocation of {sha256} was not saved", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    /// <summary>The release list, oldest first.</summary>
    public async Task<IReadOnlyList<Release>> ReadReleasesAsync(CancellationToken ct) =>
        await ReadLockedAsync(() => ReadReleases(null), "The release list cannot be read", ct).ConfigureAwait(false);

    /// <summary>The revocations, oldest first.</summary>
    public async Task<IReadOnlyList<Revocation>> ReadRevocationsAsync(CancellationToken ct) =>
        await ReadLockedAsync(() => ReadRevocations(null), "The revocations cannot be read", ct).ConfigureAwait(false);

    private async Task<IReadOnlyList<T>> ReadLockedAsync<T>(Func<List<T>> read, string what, CancellationToken ct)
    {
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            return read();
        }
        catch (Exception ex) when (ex is SqliteException or IOException)
        {
            throw SqliteFailures.Map(ex, what, DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }

    private List<Release> ReadReleases(SqliteTransaction? transaction) => ReleaseList.ReadReleases(_connection, transaction);

    private List<Revocation> ReadRevocations(SqliteTransaction? transaction) => ReleaseList.ReadRevocations(_connection, transaction);
}
