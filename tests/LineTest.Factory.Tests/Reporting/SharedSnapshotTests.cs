using LineTest.Factory.Reporting;
using LineTest.Factory.Tests.Support;
using Npgsql;

namespace LineTest.Factory.Tests.Reporting;

public sealed class SharedSnapshotTests
{
    /// <summary>
    /// Regression: the snapshot was exported inside a savepoint, and PostgreSQL refuses to export a snapshot from a
    /// subtransaction, so every report ran on one connection while saying nothing of it.
    /// </summary>
    [PostgresFact]
    public async Task OpenAsync_OrdinaryServer_SharedAndAJoinedConnectionSeesTheSameRowsNotLaterOnes()
    {
        await using var database = await TestDatabase.CreateAsync();
        await database.ExecuteAsync("CREATE TABLE t (v integer); INSERT INTO t VALUES (1);");

        await using var session = await SharedSnapshot.OpenAsync(database.DataSource, CancellationToken.None);
        await database.ExecuteAsync("INSERT INTO t VALUES (2);");
        var (connection, transaction) = await session.JoinAsync(CancellationToken.None);
        await using var count = new NpgsqlCommand("SELECT count(*) FROM t;", connection, transaction);

        Assert.True(session.Shared);
        Assert.Equal(1L, await count.ExecuteScalarAsync());
    }
}
