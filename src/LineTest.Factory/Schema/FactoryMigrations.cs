using System.Security.Cryptography;
using System.Text;
using Npgsql;

namespace LineTest.Factory.Schema;

/// <summary>
/// Applies the SQL files of <c>Migrations/</c> (embedded, named <c>NNNN_what.sql</c>) in order, each in its own
/// transaction, and records each in <c>schema_migrations</c> with its SHA-256. A file already applied whose text
/// has since changed is refused rather than run again. Several stations may start at once: an advisory lock
/// makes one of them migrate while the others wait.
/// </summary>
public static class FactoryMigrations
{
    private const string ResourcePrefix = "LineTest.Factory.Migrations.";
    private const long LockKey = 0x4C54_4D49_4752; // 'LTMIGR'

    /// <summary>The migrations in the order they are applied.</summary>
    public static IReadOnlyList<FactoryMigration> All { get; } = Load();

    /// <summary>The schema version this code writes and reads (the highest migration).</summary>
    public static int CurrentVersion => All[^1].Version;

    /// <summary>Brings the database up to <see cref="CurrentVersion"/>; returns the versions applied now.</summary>
    /// <exception cref="FactorySchemaException">The database has a migration this code does not know, or one whose text changed.</exception>
    public static async Task<IReadOnlyList<int>> ApplyAsync(NpgsqlDataSource dataSource, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        await using var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        await Execute(connection, null, "SELECT pg_advisory_lock(@key);", ct, ("key", LockKey)).ConfigureAwait(false);
        try
        {
            await Execute(connection, null, """
                CREATE TABLE IF NOT EXISTS schema_migrations (
                    version     integer     PRIMARY KEY,
                    name        text        NOT NULL,
                    sha256      text        NOT NULL,
                    applied_utc timestamptz NOT NULL DEFAULT now());
                """, ct).ConfigureAwait(false);
            var applied = new Dictionary<int, string>();
            await using (var read = new NpgsqlCommand("SELECT version, sha256 FROM schema_migrations;", connection))
            await using (var reader = await read.ExecuteReaderAsync(ct).ConfigureAwait(false))
            {
                while (await reader.ReadAsync(ct).ConfigureAwait(false))
                {
                    applied.Add(reader.GetInt32(0), reader.GetString(1));
                }
            }

            if (applied.Keys.Where(v => All.All(m => m.Version != v)).OrderDescending().FirstOrDefault() is var unknown and > 0)
            {
                throw new FactorySchemaException(
                    $"The factory database has schema version {unknown}, which this LineTest does not know (it knows up to {CurrentVersion}). Update LineTest on this station.");
            }

            var done = new List<int>();
            foreach (var migration in All)
            {
                if (applied.TryGetValue(migration.Version, out var sha))
                {
                    if (!string.Equals(sha, migration.Sha256, StringComparison.Ordinal))
                    {
                        throw new FactorySchemaException(
                            $"Migration {migration.Name} was applied with SHA-256 {sha}, but the file now has {migration.Sha256}. Applied migrations must never change: add a new one instead.");
                    }

                    continue;
                }

                await using var transaction = await connection.BeginTransactionAsync(ct).ConfigureAwait(false);
                await Execute(connection, transaction, migration.Sql, ct).ConfigureAwait(false);
                await Execute(
                    connection,
                    transaction,
                    "INSERT INTO schema_migrations (version, name, sha256) VALUES (@v, @n, @s);",
                    ct,
                    ("v", migration.Version),
                    ("n", migration.Name),
                    ("s", migration.Sha256)).ConfigureAwait(false);
                await transaction.CommitAsync(ct).ConfigureAwait(false);
                done.Add(migration.Version);
            }

            return done;
        }
        finally
        {
            await Execute(connection, null, "SELECT pg_advisory_unlock(@key);", CancellationToken.None, ("key", LockKey)).ConfigureAwait(false);
        }
    }

    private static async Task Execute(NpgsqlConnection connection, NpgsqlTransaction? transaction, string sql, CancellationToken ct, params (string Name, object Value)[] parameters)
    {
        await using var command = new NpgsqlCommand(sql, connection, transaction);
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value);
        }

        await command.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
    }

    private static List<FactoryMigration> Load()
    {
        var assembly = typeof(FactoryMigrations).Assembly;
        var migrations = new List<FactoryMigration>();
        foreach (var resource in assembly.GetManifestResourceNames().Where(n => n.StartsWith(ResourcePrefix, StringComparison.Ordinal)).Order(StringComparer.Ordinal))
        {
            var name = resource[ResourcePrefix.Length..];
            var underscore = name.IndexOf('_', StringComparison.Ordinal);
            if (underscore != 4 || !int.TryParse(name.AsSpan(0, 4), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var version))
            {
                throw new InvalidOperationException($"Migration '{name}' is not named NNNN_what.sql.");
            }

            using var stream = assembly.GetManifestResourceStream(resource)!;
            using var reader = new StreamReader(stream, Encoding.UTF8);
            var sql = reader.ReadToEnd();
            var sha = Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(sql)));
            migrations.Add(new FactoryMigration(version, name, sql, sha));
        }

        for (var i = 0; i < migrations.Count; i++)
        {
            if (migrations[i].Version != i + 1)
            {
                throw new InvalidOperationException($"Migrations must be numbered 0001, 0002, … without gaps; found {migrations[i].Name} at position {i + 1}.");
            }
        }

        return migrations;
    }
}
