using LineTest.Factory.Schema;
using Npgsql;

namespace LineTest.Factory.Tests.Support;

/// <summary>A fresh database on the test server for one test, dropped afterwards.</summary>
public sealed class TestDatabase : IAsyncDisposable
{
    private readonly string _adminConnectionString;

    private TestDatabase(string adminConnectionString, string name, string connectionString)
    {
        _adminConnectionString = adminConnectionString;
        Name = name;
        ConnectionString = connectionString;
        DataSource = FactoryConnection.Create(connectionString);
    }

    public string Name { get; }

    public string ConnectionString { get; }

    public NpgsqlDataSource DataSource { get; }

    public static Task<TestDatabase> CreateAsync() => CreateAsync(TestPostgres.Required);

    public static async Task<TestDatabase> CreateAsync(string serverConnectionString)
    {
        var name = "lt_" + Guid.NewGuid().ToString("N")[..16];
        var connectionString = await TestPostgres.CreateDatabaseAsync(name, serverConnectionString);
        return new TestDatabase(serverConnectionString, name, connectionString);
    }

    public async Task<T> ScalarAsync<T>(string sql)
    {
        await using var command = DataSource.CreateCommand(sql);
        return (T)(await command.ExecuteScalarAsync())!;
    }

    public async Task ExecuteAsync(string sql)
    {
        await using var command = DataSource.CreateCommand(sql);
        await command.ExecuteNonQueryAsync();
    }

    public async ValueTask DisposeAsync()
    {
        await DataSource.DisposeAsync();
        try
        {
            await TestPostgres.DropDatabaseAsync(Name, _adminConnectionString);
        }
        catch (NpgsqlException)
        {
            // A server already stopped by the test (outage tests) takes its databases with it.
        }
    }
}
