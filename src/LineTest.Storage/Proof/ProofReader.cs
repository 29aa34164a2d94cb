using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using LineTest.Storage.Chain;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Proof;

/// <summary>
/// Reads from a results database what its head proves: the last run, the release list digest and the journal rows.
/// The release digest is SHA-256 (FIPS 180-4) over one line per row, releases by seq then revocations by seq, each
/// <c>release|seq|id|revision|sha256|by|utc|file</c> or <c>revoke|seq|sha256|by|utc|reason</c> followed by a line feed;
/// with no row it is <see cref="RecordHash.Genesis"/>.
/// </summary>
internal static class ProofReader
{
    /// <summary>The state of the database as its head would record it.</summary>
    /// <param name="connection">An open connection.</param>
    /// <param name="transaction">The transaction to read in, if any.</param>
    /// <param name="runs">The run count when the caller knows it; null counts the runs (a full scan).</param>
    public static HeadState Read(SqliteConnection connection, SqliteTransaction? transaction, long? runs)
    {
        long seq = 0;
        var sha = RecordHash.Genesis;
        using (var tail = Command(connection, transaction, "SELECT seq, record_sha256 FROM runs ORDER BY seq DESC LIMIT 1;"))
        using (var reader = tail.ExecuteReader())
        {
            if (reader.Read())
            {
                seq = reader.GetInt64(0);
                sha = reader.IsDBNull(1) ? string.Empty : reader.GetString(1);
            }
        }

        var count = runs ?? Convert.ToInt64(Scalar(connection, transaction, "SELECT count(*) FROM runs;"), CultureInfo.InvariantCulture);
        var (releases, digest) = ReleaseDigest(connection, transaction);
        return new HeadState(seq, sha, count, releases, digest, Journal(connection, transaction));
    }

    /// <summary>The highest seq the database ever gave a run (<c>sqlite_sequence</c>), 0 when none.</summary>
    public static long IssuedSeq(SqliteConnection connection, SqliteTransaction? transaction) =>
        Scalar(connection, transaction, "SELECT seq FROM sqlite_sequence WHERE name = 'runs';") is long issued ? issued : 0;

    /// <summary>SHA-256 of a journal row's text, as the head records it.</summary>
    public static string JournalHash(string recordJson) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(recordJson)));

    private static IReadOnlyList<JournalProof> Journal(SqliteConnection connection, SqliteTransaction? transaction)
    {
        if (!TableExists(connection, transaction, "runs_in_progress"))
        {
            return [];
        }

        using var command = Command(connection, transaction, "SELECT id, record_json FROM runs_in_progress ORDER BY id;");
        using var reader = command.ExecuteReader();
        var rows = new List<JournalProof>();
        while (reader.Read())
        {
            rows.Add(new JournalProof(Text(reader, 0), JournalHash(Text(reader, 1))));
        }

        return rows;
    }

    private static (long Count, string Digest) ReleaseDigest(SqliteConnection connection, SqliteTransaction? transaction)
    {
        var text = new StringBuilder();
        long count = 0;
        if (TableExists(connection, transaction, "releases"))
        {
            count += AppendRows(connection, transaction, text, "release",
                "SELECT seq, sequence_id, sequence_revision, sha256, released_by, released_utc, file FROM releases ORDER BY seq;");
        }

        if (TableExists(connection, transaction, "release_revocations"))
        {
            count += AppendRows(connection, transaction, text, "revoke",
                "SELECT seq, sha256, revoked_by, revoked_utc, reason FROM release_revocations ORDER BY seq;");
        }

        var digest = count == 0
            ? RecordHash.Genesis
            : Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
        return (count, digest);
    }

    private static long AppendRows(SqliteConnection connection, SqliteTransaction? transaction, StringBuilder text, string kind, string sql)
    {
        using var command = Command(connection, transaction, sql);
        using var reader = command.ExecuteReader();
        long count = 0;
        while (reader.Read())
        {
            text.Append(kind);
            for (var i = 0; i < reader.FieldCount; i++)
            {
                text.Append('|').Append(Convert.ToString(reader.GetValue(i), CultureInfo.InvariantCulture));
            }

            text.Append('\n');
            count++;
        }

        return count;
    }

    private static bool TableExists(SqliteConnection connection, SqliteTransaction? transaction, string table)
    {
        using var command = Command(connection, transaction, "SELECT count(*) FROM sqlite_schema WHERE type = 'table' AND name = $name;");
        command.Parameters.AddWithValue("$name", table);
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture) > 0;
    }

    private static string Text(SqliteDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? string.Empty : Convert.ToString(reader.GetValue(ordinal), CultureInfo.InvariantCulture) ?? string.Empty;

    private static object? Scalar(SqliteConnection connection, SqliteTransaction? transaction, string sql)
    {
        using var command = Command(connection, transaction, sql);
        return command.ExecuteScalar();
    }

    private static SqliteCommand Command(SqliteConnection connection, SqliteTransaction? transaction, string sql)
    {
        var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        return command;
    }
}
