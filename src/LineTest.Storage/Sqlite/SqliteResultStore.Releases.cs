using LineTest.Storage.Releases;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The release list (<c>releases</c>): sequence files released to production, by content hash. Kept in the results
/// database so that the list travels with the runs it governs and is append-only like them.
/// </summary>
public sealed partial class SqliteResultStore
{
    /// <summary>Adds <paramref name="release"/> to the release list (flushed before this returns).</summary>
    /// <exception cref="Store.ResultStoreException">The list could not be written; the message says why.</exception>
    public async Task AddReleaseAsync(Release release, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(release);
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            using var command = _connection.CreateCommand();
            command.CommandText = """
                INSERT INTO releases (sequence_id, sequence_revision, sha256, released_by, released_utc, file)
                VALUES ($id, $revision, $sha, $by, $at, $file);
                """;
            command.Parameters.AddWithValue("$id", release.SequenceId);
            command.Parameters.AddWithValue("$revision", (long)release.SequenceRevision);
            command.Parameters.AddWithValue("$sha", release.Sha256.ToLowerInvariant());
            command.Parameters.AddWithValue("$by", release.ReleasedBy);
            command.Parameters.AddWithValue("$at", UtcText.ToText(release.ReleasedUtc));
            command.Parameters.AddWithValue("$file", release.File);
            command.ExecuteNonQuery();
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

    /// <summary>The release list, oldest first.</summary>
    public async Task<IReadOnlyList<Release>> ReadReleasesAsync(CancellationToken ct)
    {
        await _writeLock.WaitAsync(ct).ConfigureAwait(false);
        try
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            using var command = _connection.CreateCommand();
            command.CommandText = "SELECT sequence_id, sequence_revision, sha256, released_by, released_utc, file FROM releases ORDER BY seq;";
            using var reader = command.ExecuteReader();
            var releases = new List<Release>();
            while (reader.Read())
            {
                releases.Add(new Release(
                    reader.GetString(0), checked((int)reader.GetInt64(1)), reader.GetString(2), reader.GetString(3),
                    UtcText.Parse(reader.GetString(4)), reader.GetString(5)));
            }

            return releases;
        }
        catch (Exception ex) when (ex is SqliteException or IOException)
        {
            throw SqliteFailures.Map(ex, "The release list cannot be read", DatabasePath);
        }
        finally
        {
            _writeLock.Release();
        }
    }
}
