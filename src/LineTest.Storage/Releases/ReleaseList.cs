using LineTest.Storage.Sqlite;
using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Releases;

/// <summary>Reads the release list and its revocations; <see cref="ReadAsync"/> reads without the writer lock.</summary>
public static class ReleaseList
{
    /// <summary>Reads the release list and revocations of the database at <paramref name="databasePath"/> (read only).</summary>
    /// <exception cref="ResultStoreException">The database cannot be read.</exception>
    public static async Task<(IReadOnlyList<Release> Releases, IReadOnlyList<Revocation> Revocations)> ReadAsync(string databasePath, CancellationToken ct)
    {
        var reader = new SqliteResultReader(databasePath);
        await using var connection = await reader.OpenAsync(ct).ConfigureAwait(false);
        try
        {
            return (ReadReleases(connection, null), ReadRevocations(connection, null));
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, "The release list cannot be read", reader.DatabasePath);
        }
    }

    internal static List<Release> ReadReleases(SqliteConnection connection, SqliteTransaction? transaction)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
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

    internal static List<Revocation> ReadRevocations(SqliteConnection connection, SqliteTransaction? transaction)
    {
        using var exists = connection.CreateCommand();
        exists.Transaction = transaction;
        exists.CommandText = "SELECT count(*) FROM sqlite_schema WHERE type = 'table' AND name = 'release_revocations';";
        if ((long)exists.ExecuteScalar()! == 0)
        {
            return [];
        }

        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT sha256, revoked_by, revoked_utc, reason FROM release_revocations ORDER BY seq;";
        using var reader = command.ExecuteReader();
        var revocations = new List<Revocation>();
        while (reader.Read())
        {
            revocations.Add(new Revocation(reader.GetString(0), reader.GetString(1), UtcText.Parse(reader.GetString(2)), reader.GetString(3)));
        }

        return revocations;
    }
}
