using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// A repeatable-read transaction whose snapshot other connections can join (<c>pg_export_snapshot</c>, <c>SET
/// TRANSACTION SNAPSHOT</c>), so several queries at once see exactly the same runs. Where the server cannot export a
/// snapshot, <see cref="Shared"/> is false and only <see cref="Connection"/> is to be used.
/// </summary>
internal sealed class SharedSnapshot : IAsyncDisposable
{
    private readonly NpgsqlDataSource _dataSource;
    private readonly string? _snapshot;
    private readonly List<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> _joined = [];
    private readonly Lock _gate = new();

    private SharedSnapshot(NpgsqlDataSource dataSource, NpgsqlConnection connection, NpgsqlTransaction transaction, string? snapshot)
    {
        _dataSource = dataSource;
        Connection = connection;
        Transaction = transaction;
        _snapshot = snapshot;
    }

    /// <summary>The connection that holds the snapshot.</summary>
    public NpgsqlConnection Connection { get; }

    /// <summary>Its transaction.</summary>
    public NpgsqlTransaction Transaction { get; }

    /// <summary>True when other connections can join the snapshot.</summary>
    public bool Shared => _snapshot is not null;

    /// <summary>Opens a connection, begins the transaction and exports its snapshot where the server allows.</summary>
    public static async Task<SharedSnapshot> OpenAsync(NpgsqlDataSource dataSource, CancellationToken ct)
    {
        var connection = await dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        try
        {
            // Exported as the transaction's first statement, not inside a savepoint: PostgreSQL refuses to export a
            // snapshot from a subtransaction. Where it refuses anyway (a hot standby during recovery), the transaction is
            // aborted, so a new one is begun and only this connection is used.
            var transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
            string? snapshot;
            try
            {
                await using var export = new NpgsqlCommand("SELECT pg_export_snapshot();", connection, transaction);
                snapshot = (string)(await export.ExecuteScalarAsync(ct).ConfigureAwait(false))!;
            }
            catch (PostgresException)
            {
                await transaction.DisposeAsync().ConfigureAwait(false);
                transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
                snapshot = null;
            }

            return new SharedSnapshot(dataSource, connection, transaction, snapshot);
        }
        catch
        {
            await connection.DisposeAsync().ConfigureAwait(false);
            throw;
        }
    }

    /// <summary>Another connection in a transaction on the same snapshot; closed with this object.</summary>
    public async Task<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> JoinAsync(CancellationToken ct)
    {
        if (_snapshot is null)
        {
            throw new InvalidOperationException("The server did not export the snapshot; use the one connection.");
        }

        var connection = await _dataSource.OpenConnectionAsync(ct).ConfigureAwait(false);
        try
        {
            var transaction = await connection.BeginTransactionAsync(System.Data.IsolationLevel.RepeatableRead, ct).ConfigureAwait(false);
            // The snapshot id comes from the server (e.g. 00000003-0000001B-1), never from input.
            await using (var import = new NpgsqlCommand($"SET TRANSACTION SNAPSHOT '{_snapshot.Replace("'", "''", StringComparison.Ordinal)}';", connection, transaction))
            {
                await import.ExecuteNonQueryAsync(ct).ConfigureAwait(false);
            }

            lock (_gate)
            {
                _joined.Add((connection, transaction));
            }

            return (connection, transaction);
        }
        catch
        {
            await connection.DisposeAsync().ConfigureAwait(false);
            throw;
        }
    }

    public async ValueTask DisposeAsync()
    {
        List<(NpgsqlConnection Connection, NpgsqlTransaction Transaction)> joined;
        lock (_gate)
        {
            joined = [.. _joined];
        }

        foreach (var (connection, transaction) in joined)
        {
            await transaction.DisposeAsync().ConfigureAwait(false);
            await connection.DisposeAsync().ConfigureAwait(false);
        }

        await Transaction.DisposeAsync().ConfigureAwait(false);
        await Connection.DisposeAsync().ConfigureAwait(false);
    }
}
