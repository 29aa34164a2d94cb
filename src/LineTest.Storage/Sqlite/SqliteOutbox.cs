using LineTest.Storage.Store;
using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// The station side of store-and-forward: reads the runs a factory database has not committed yet, in <c>seq</c>
/// order, and moves the watermark once it has (see <see cref="SqliteOutboxSchema"/>). Uses its own connection, so
/// it runs beside the station's writer (WAL); it never changes a stored run.
/// </summary>
/// <remarks>Not thread-safe: one forwarder owns an outbox.</remarks>
public sealed class SqliteOutbox : IAsyncDisposable
{
    private readonly SqliteConnection _connection;

    private SqliteOutbox(string databasePath, SqliteConnection connection, string chainId)
    {
        DatabasePath = databasePath;
        _connection = connection;
        ChainId = chainId;
    }

    /// <summary>The database file.</summary>
    public string DatabasePath { get; }

    /// <summary>This database's chain id (32 hex digits), under which the factory keeps its hash chain.</summary>
    public string ChainId { get; }

    /// <summary>
    /// Opens the outbox of the existing <c>results.db</c> in <paramref name="resultsDirectory"/>, adding the outbox to a
    /// database of an older schema. Never creates the database: that is the station's store's job (it also starts the
    /// folder's proof files).
    /// </summary>
    /// <exception cref="ResultStoreException">The database cannot be opened or is not a LineTest results database.</exception>
    public static SqliteOutbox Open(string resultsDirectory)
    {
        const string what = "The station's outbox cannot be opened";
        var path = ResultsDatabase.PathIn(resultsDirectory);
        if (!File.Exists(path))
        {
            throw new ResultStoreException(ResultStoreFailure.CannotOpen, $"{what}: '{path}' does not exist yet (no run has been stored).");
        }

        var connection = new SqliteConnection(ResultsDatabase.ConnectionString(path, SqliteOpenMode.ReadWrite));
        try
        {
            connection.Open();
            Execute(connection, "PRAGMA journal_mode = WAL; PRAGMA synchronous = FULL; PRAGMA busy_timeout = 0;");
            if (SqliteSchema.EnsureCreated(connection) is { } problem)
            {
                throw new ResultStoreException(ResultStoreFailure.Incompatible, $"{what}: '{path}' cannot be used because {problem}.");
            }

            using var command = connection.CreateCommand();
            command.CommandText = "SELECT chain_id FROM outbox_source WHERE only_row = 1;";
            var chainId = (string)command.ExecuteScalar()!;
            return new SqliteOutbox(path, connection, chainId);
        }
        catch (Exception ex) when (ex is SqliteException or IOException or UnauthorizedAccessException or ResultStoreException)
        {
            connection.Dispose();
            throw SqliteFailures.Map(ex, what, path);
        }
    }

    /// <summary>Up to <paramref name="max"/> runs after the watermark of <paramref name="factoryId"/>, in seq order.</summary>
    public Task<IReadOnlyList<OutboxRun>> ReadPendingAsync(string factoryId, int max, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(factoryId);
        ArgumentOutOfRangeException.ThrowIfLessThan(max, 1);
        return Guard("The runs to forward could not be read", () =>
        {
            using var command = _connection.CreateCommand();
            command.CommandText = """
                SELECT seq, id, station, ended_utc, prev_sha256, record_sha256, run_json FROM runs
                WHERE seq > coalesce((SELECT through_seq FROM outbox_forwarded WHERE factory_id = $factory), 0)
                ORDER BY seq LIMIT $max;
                """;
            command.Parameters.AddWithValue("$factory", factoryId);
            command.Parameters.AddWithValue("$max", max);
            using var reader = command.ExecuteReader();
            var runs = new List<OutboxRun>();
            while (reader.Read())
            {
                ct.ThrowIfCancellationRequested();
                runs.Add(new OutboxRun(
                    reader.GetInt64(0),
                    Guid.ParseExact(reader.GetString(1), "D"),
                    reader.GetString(2),
                    UtcText.Parse(reader.GetString(3)),
                    reader.GetString(4),
                    reader.GetString(5),
                    reader.GetString(6)));
            }

            return (IReadOnlyList<OutboxRun>)runs;
        });
    }

    /// <summary>
    /// Records that <paramref name="factoryId"/> has committed every run up to <paramref name="throughSeq"/>. Call only
    /// after the server's commit returned. The watermark never moves backwards.
    /// </summary>
    public Task MarkForwardedAsync(string factoryId, long throughSeq, DateTimeOffset atUtc, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(factoryId);
        ArgumentOutOfRangeException.ThrowIfNegative(throughSeq);
        return Guard("The forwarded runs could not be marked", () =>
        {
            using var command = _connection.CreateCommand();
            command.CommandText = """
                INSERT INTO outbox_forwarded (factory_id, through_seq, forwarded_utc) VALUES ($factory, $seq, $at)
                ON CONFLICT (factory_id) DO UPDATE SET
                    through_seq = max(through_seq, excluded.through_seq), forwarded_utc = excluded.forwarded_utc;
                """;
            command.Parameters.AddWithValue("$factory", factoryId);
            command.Parameters.AddWithValue("$seq", throughSeq);
            command.Parameters.AddWithValue("$at", UtcText.ToText(atUtc));
            command.ExecuteNonQuery();
            return 0;
        });
    }

    /// <summary>How many runs wait for <paramref name="factoryId"/>, and since when.</summary>
    public Task<OutboxBacklog> ReadBacklogAsync(string factoryId, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(factoryId);
        return Guard("The backlog could not be read", () =>
        {
            using var command = _connection.CreateCommand();
            // Both look-ups are ranges of the seq key: cheap however large the database is.
            command.CommandText = """
                SELECT w.through_seq,
                       (SELECT count(*) FROM runs WHERE seq > w.through_seq),
                       (SELECT ended_utc FROM runs WHERE seq > w.through_seq ORDER BY seq LIMIT 1)
                FROM (SELECT coalesce((SELECT through_seq FROM outbox_forwarded WHERE factory_id = $factory), 0) AS through_seq) w;
                """;
            command.Parameters.AddWithValue("$factory", factoryId);
            using var reader = command.ExecuteReader();
            reader.Read();
            return new OutboxBacklog(
                reader.GetInt64(1),
                reader.IsDBNull(2) ? null : UtcText.Parse(reader.GetString(2)),
                reader.GetInt64(0));
        });
    }

    /// <summary>The factory database this station forwarded to most recently, or null if it never did.</summary>
    public Task<string?> ReadLastFactoryIdAsync(CancellationToken ct = default) =>
        Guard("The outbox could not be read", () =>
        {
            ct.ThrowIfCancellationRequested();
            using var command = _connection.CreateCommand();
            command.CommandText = "SELECT factory_id FROM outbox_forwarded ORDER BY forwarded_utc DESC LIMIT 1;";
            return command.ExecuteScalar() as string;
        });

    /// <inheritdoc />
    public ValueTask DisposeAsync()
    {
        _connection.Dispose();
        return ValueTask.CompletedTask;
    }

    private Task<T> Guard<T>(string what, Func<T> action)
    {
        try
        {
            return Task.FromResult(action());
        }
        catch (SqliteException ex)
        {
            throw SqliteFailures.Map(ex, what, DatabasePath);
        }
    }

    private static void Execute(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }
}
