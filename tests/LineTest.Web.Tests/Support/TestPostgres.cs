using Npgsql;

namespace LineTest.Web.Tests.Support;

/// <summary>
/// The PostgreSQL server for the factory-source tests: <c>LINETEST_TEST_POSTGRES</c> (an Npgsql connection string to a
/// server where databases may be created), exported by <c>.ci/run</c>, as for the factory's own tests. Outside CI the
/// tests are skipped with the reason when it is absent; in CI (<c>CI=true</c>) they run and fail, so a missing server
/// cannot pass.
/// </summary>
internal static class TestPostgres
{
    public const string Variable = "LINETEST_TEST_POSTGRES";

    public static string? ConnectionString => Environment.GetEnvironmentVariable(Variable) is { Length: > 0 } value ? value : null;

    public static string? SkipReason =>
        ConnectionString is null && !string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase)
            ? $"needs a PostgreSQL server: set {Variable} (an Npgsql connection string), as .ci/run does"
            : null;

    /// <summary>A fresh database on the server; returns its connection string.</summary>
    public static async Task<string> CreateDatabaseAsync(string name)
    {
        var server = ConnectionString ?? throw new InvalidOperationException($"CI=true but {Variable} is not set: .ci/run must start a PostgreSQL server.");
        await using var admin = new NpgsqlConnection(server);
        await admin.OpenAsync();
        await using var create = new NpgsqlCommand($"CREATE DATABASE {name};", admin);
        await create.ExecuteNonQueryAsync();
        return new NpgsqlConnectionStringBuilder(server) { Database = name }.ConnectionString;
    }

    public static async Task DropDatabaseAsync(string name)
    {
        NpgsqlConnection.ClearAllPools();
        await using var admin = new NpgsqlConnection(ConnectionString);
        await admin.OpenAsync();
        await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS {name} WITH (FORCE);", admin);
        await drop.ExecuteNonQueryAsync();
    }
}
